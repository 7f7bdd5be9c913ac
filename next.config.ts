import type { NextConfig } from "next";
import createNextIntlPlugin from "next-intl/plugin";
import { MAX_BODY_BYTES } from "./src/server/platform/body-limits";
import { SECURITY_HEADERS } from "./src/server/platform/security-headers";

const withNextIntl = createNextIntlPlugin("./src/i18n/request.ts");

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // forbidden() from next/navigation renders app/forbidden.tsx with a 403.
  // Server actions take the same 1 MiB as every other request (src/server/platform/body-limits.ts).
  experimental: { authInterrupts: true, serverActions: { bodySizeLimit: MAX_BODY_BYTES } },
  serverExternalPackages: ["better-sqlite3", "@node-rs/argon2", "@zxing/library"],
  async headers() {
    return [{ source: "/:path*", headers: [...SECURITY_HEADERS] }];
  },
};

export default withNextIntl(nextConfig);
