import type { Metadata } from "next";
import { headers } from "next/headers";
import "./globals.css";
import { plexMono, plexSans } from "./fonts";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Cairn", template: "%s · Cairn" },
  description: "Evidence locker for inspection flights: recordings, findings, reports and custody.",
  icons: { icon: "/cairn-mark.svg" },
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Reading the request makes every page render per request, so each answer carries the nonce of
  // its own Content-Security-Policy (proxy.ts sets it, with x-nonce; Next stamps it on its scripts);
  // a page prerendered at build time would carry no nonce and its scripts would be refused.
  await headers();
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
