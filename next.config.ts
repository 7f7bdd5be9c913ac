import type { NextConfig } from "next";
import createNextIntlPlugin from "next-intl/plugin";
import { MAX_BODY_BYTES } from "./src/server/platform/body-limits";
import { SECURITY_HEADERS } from "./src/server/platform/security-headers";

// The catalogues are compiled when the build is made (next-intl's precompile): every page then
// ships a formatter of about 4 kB gzip instead of the ICU message parser (about 13 kB).
const withNextIntl = createNextIntlPlugin({
  requestConfig: "./src/i18n/request.ts",
  experimental: { messages: { path: "./src/i18n/messages", format: "json", locales: "infer", precompile: true } },
});

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
