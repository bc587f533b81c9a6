// A new organisation with its first owner.
import { z } from "zod";
import { password } from "./members";
import { name } from "./common";
import { isTimeZone, canonicalTimeZone } from "./work";

export const organisationInput = z.object({
  name: name(120),
  slug: z
    .string()
    .trim()
    .toLowerCase()
    .min(2, "At least 2 characters")
    .max(60, "At most 60 characters")
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, "Lower-case letters, digits and single hyphens"),
  timeZone: z.string().trim().max(60).refine(isTimeZone, "Unknown time zone").transform(canonicalTimeZone).default("UTC"),
  owner: z.object({
    email: z.string().trim().toLowerCase().email("Not an e-mail address").max(320),
    name: name(120),
    password,
  }),
});
export type OrganisationInput = z.input<typeof organisationInput>;
