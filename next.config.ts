import type { NextConfig } from "next";
import createNextIntlPlugin from "next-intl/plugin";
import { SECURITY_HEADERS } from "./src/server/security-headers";

const withNextIntl = createNextIntlPlugin("./src/i18n/request.ts");

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // forbidden() from next/navigation renders app/forbidden.tsx with a 403.
  experimental: { authInterrupts: true },
  serverExternalPackages: ["better-sqlite3", "@node-rs/argon2", "@zxing/library"],
  async headers() {
    return [{ source: "/:path*", headers: [...SECURITY_HEADERS] }];
  },
};

export default withNextIntl(nextConfig);
