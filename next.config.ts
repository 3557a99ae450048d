import type { NextConfig } from "next";
import createNextIntlPlugin from "next-intl/plugin";

const withNextIntl = createNextIntlPlugin("./lib/i18n/request.ts");

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // The build checks the app's own code; `npm test` type-checks everything, tests included.
  typescript: { tsconfigPath: "tsconfig.build.json" },
  reactStrictMode: true,
  serverExternalPackages: ["@react-pdf/renderer", "pg", "pg-boss"],
  experimental: {
    authInterrupts: true,
  },
  // Security headers that do not depend on the request; the CSP with its nonce is set in proxy.ts.
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "Strict-Transport-Security", value: "max-age=31536000; includeSubDomains" },
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Permissions-Policy", value: "camera=(self), microphone=(), geolocation=()" },
          { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
        ],
      },
      // The portal's service worker: always revalidated, so a fix reaches phones at once.
      { source: "/sw.js", headers: [{ key: "Cache-Control", value: "no-cache" }, { key: "Service-Worker-Allowed", value: "/" }] },
      // Pages with a secret in their address get their headers in proxy.ts (lib/http/secret-headers);
      // the device card's paths skip the proxy and set them in their handlers, but the policy
      // above would win over a handler's own Referrer-Policy, so the card's is set here, last.
      { source: "/:locale/p/:path*", headers: [{ key: "Referrer-Policy", value: "no-referrer" }] },
    ];
  },
};

export default withNextIntl(nextConfig);
