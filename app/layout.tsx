import type { Metadata } from "next";
import "./globals.css";
import { plexMono, plexSans } from "./fonts";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Cairn", template: "%s · Cairn" },
  description: "Evidence locker for inspection flights: recordings, findings, reports and custody.",
  icons: { icon: "/cairn-mark.svg" },
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
