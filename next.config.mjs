/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native and adapter packages stay outside the server bundle and load from node_modules.
  serverExternalPackages: ["better-sqlite3", "@prisma/adapter-better-sqlite3", "bcryptjs"],
  poweredByHeader: false,
  // forbidden()/unauthorized() let a page refuse a role with a proper 403 page (app/forbidden.tsx).
  experimental: { authInterrupts: true },
  async headers() {
    return [
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "X-Frame-Options", value: "DENY" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
        ],
      },
      // JSON and CSV answers never render as a page; pages get their nonce-based policy from proxy.ts.
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" }] },
    ];
  },
};

export default nextConfig;
