"use client";
// Sign-in with e-mail and password, or with a one-time link sent by mail. Both answer the same
// way for known and unknown addresses.
import { signIn } from "next-auth/react";
import { useRouter, useSearchParams } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { useState } from "react";
import { Field } from "@/components/ui/field";
import { Button } from "@/components/ui/button";

const passwordForm = z.object({ email: z.string().trim().email("Not an e-mail address"), password: z.string().min(1, "Required") });
const linkForm = z.object({ email: z.string().trim().email("Not an e-mail address") });

export function SignInForm() {
  const router = useRouter();
  const search = useSearchParams();
  const [mode, setMode] = useState<"password" | "link">("password");
  const [error, setError] = useState<string | null>(
    search.get("error") === "membership" ? "Your membership has ended. Ask an owner to invite you again." : search.get("error") ? "That sign-in link is no longer valid. Ask for a new one." : null,
  );
  const pw = useForm<z.infer<typeof passwordForm>>({ resolver: zodResolver(passwordForm) });
  const link = useForm<z.infer<typeof linkForm>>({ resolver: zodResolver(linkForm) });

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-xl font-semibold">Sign in</h1>
      <div role="tablist" aria-label="Sign-in method" className="grid grid-cols-2 gap-1 rounded-md bg-paper-2 p-1 text-sm">
        {(["password", "link"] as const).map((m) => (
          <button
            key={m}
            role="tab"
            type="button"
            aria-selected={mode === m}
            onClick={() => {
              setMode(m);
              setError(null);
            }}
            className={`rounded px-3 py-2 ${mode === m ? "bg-paper font-medium shadow-sm" : ""}`}
          >
            {m === "password" ? "Password" : "E-mail me a link"}
          </button>
        ))}
      </div>
      {error && (
        <p role="alert" className="rounded-md border border-bad bg-bad-soft px-3 py-2 text-sm">
          {error}
        </p>
      )}
      {mode === "password" ? (
        <form
          className="flex flex-col gap-4"
          onSubmit={pw.handleSubmit(async (v) => {
            setError(null);
            const res = await signIn("password", { email: v.email, password: v.password, redirect: false });
            // 429 from lib/auth/sign-in-limit-gate.ts: this address waits; the e-mail link still works
            if (res?.error === "rate_limited") setError("Too many tries from here for this account. Wait a few minutes, or choose “E-mail me a link”.");
            else if (!res || res.error) setError("E-mail or password not recognised.");
            else router.replace(search.get("callbackUrl") ?? "/today");
          })}
        >
          <Field label="E-mail" type="email" autoComplete="username" {...pw.register("email")} error={pw.formState.errors.email?.message} />
          <Field label="Password" type="password" autoComplete="current-password" {...pw.register("password")} error={pw.formState.errors.password?.message} />
          <Button type="submit" busy={pw.formState.isSubmitting}>
            Sign in
          </Button>
        </form>
      ) : (
        <form
          className="flex flex-col gap-4"
          onSubmit={link.handleSubmit(async (v) => {
            setError(null);
            const res = await signIn("email", { email: v.email, redirect: false, callbackUrl: "/today" });
            if (res?.error === "rate_limited") setError("Too many links asked for from here. Wait a while, then ask again.");
            else router.push("/sign-in/check-mail");
          })}
        >
          <Field label="E-mail" type="email" autoComplete="username" {...link.register("email")} error={link.formState.errors.email?.message} />
          <Button type="submit" busy={link.formState.isSubmitting}>
            Send sign-in link
          </Button>
        </form>
      )}
    </div>
  );
}
