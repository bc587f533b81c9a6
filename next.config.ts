import type { NextConfig } from "next";

const config: NextConfig = {
  reactStrictMode: true,
  // parallel test runs build into folders of their own (tests/support/test-env.ts)
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  // worker-side and native-ish packages stay as Node requires, not bundled
  serverExternalPackages: ["@tus/server", "@tus/file-store", "bullmq", "ioredis", "fluent-ffmpeg", "postgres", "bcryptjs", "nodemailer", "@react-pdf/renderer"],
  typedRoutes: false,
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "SAMEORIGIN" },
        ],
      },
    ];
  },
};

export default config;
