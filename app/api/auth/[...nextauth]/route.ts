// next-auth endpoints: sign-in (password, e-mail link), callback, session, sign-out. Sign-in tries
// from an address that must wait are answered 429 here, before next-auth (lib/auth/sign-in-limit-gate.ts).
import NextAuth from "next-auth";
import type { NextRequest } from "next/server";
import { authOptions } from "@/lib/auth/auth-options";
import { signInLimitGate } from "@/lib/auth/sign-in-limit-gate";

type Ctx = { params: Promise<{ nextauth: string[] }> };

const handler = NextAuth(authOptions) as (req: NextRequest, ctx: Ctx) => Promise<Response>;

export async function POST(req: NextRequest, ctx: Ctx): Promise<Response> {
  const limited = await signInLimitGate(req, (await ctx.params).nextauth);
  return limited ?? handler(req, ctx);
}

export { handler as GET };
