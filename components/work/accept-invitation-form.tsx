"use client";
// Accepting an invitation: a new person sets a name and password and is signed in straight away;
// someone with an account joins and then signs in as usual.
import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormError } from "@/components/ui/panel";
import { newAccountForm } from "@/lib/validation/members";
import { fetchJson, FetchError } from "@/components/fetch-json";

type Values = z.infer<typeof newAccountForm>;

export function AcceptInvitationForm({ token, email, organisationName, hasAccount }: { token: string; email: string; organisationName: string; hasAccount: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<Error | null>(null);
  const [joined, setJoined] = useState(false);
  const [joining, setJoining] = useState(false);
  const form = useForm<Values>({ resolver: zodResolver(newAccountForm), defaultValues: { name: "", password: "", confirm: "" } });

  if (joined) {
    return (
      <div className="flex flex-col gap-3">
        <p role="status" className="rounded-md border border-good bg-paper-2 px-3 py-2 text-sm">
          You joined {organisationName}. Sign in with your usual password or an e-mail link.
        </p>
        <Link href="/sign-in" className="text-sm text-lake underline">
          Go to sign-in
        </Link>
      </div>
    );
  }

  if (hasAccount) {
    return (
      <div className="flex flex-col gap-3">
        <p className="text-sm">You already have a Cairn account with this address; joining adds {organisationName} to it.</p>
        <FormError error={error} />
        <Button
          busy={joining}
          onClick={async () => {
            setError(null);
            setJoining(true);
            try {
              await fetchJson("/api/invitations/accept", { method: "POST", json: { token } });
              setJoined(true);
            } catch (err) {
              setError(err as Error);
            } finally {
              setJoining(false);
            }
          }}
        >
          Join {organisationName}
        </Button>
      </div>
    );
  }

  return (
    <form
      className="flex flex-col gap-4"
      noValidate
      onSubmit={form.handleSubmit(async (v) => {
        setError(null);
        try {
          await fetchJson("/api/invitations/accept", { method: "POST", json: { token, name: v.name, password: v.password } });
        } catch (err) {
          if (err instanceof FetchError && err.fields) {
            for (const [k, msgs] of Object.entries(err.fields)) if (k === "name" || k === "password") form.setError(k, { message: msgs[0] });
          }
          setError(err as Error);
          return;
        }
        const res = await signIn("password", { email, password: v.password, redirect: false });
        if (!res || res.error) router.replace("/sign-in");
        else router.replace("/today");
      })}
    >
      <Field label="Your name" autoComplete="name" {...form.register("name")} error={form.formState.errors.name?.message} />
      <Field label="Choose a password" type="password" autoComplete="new-password" hint="At least 12 characters." {...form.register("password")} error={form.formState.errors.password?.message} />
      <Field label="Password again" type="password" autoComplete="new-password" {...form.register("confirm")} error={form.formState.errors.confirm?.message} />
      <FormError error={error} />
      <Button type="submit" busy={form.formState.isSubmitting}>
        Create account and join
      </Button>
    </form>
  );
}
