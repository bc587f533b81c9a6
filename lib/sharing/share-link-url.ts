// The address a recipient opens. Built from APP_URL so mails carry the public address of the app.
import "server-only";
import { env } from "@/lib/config/env";

export const shareLinkPath = (token: string) => `/s/${token}`;
export const shareLinkUrl = (token: string) => `${env().APP_URL.replace(/\/+$/, "")}${shareLinkPath(token)}`;
