import type { NextConfig } from "next";

/**
 * The Content-Security-Policy of every page. Next's App Router streams its payload in inline
 * `<script>` elements and React sets `style` attributes, so scripts and styles allow 'unsafe-inline'
 * (a nonce would make every page dynamic); everything else comes from this origin only, nothing may
 * frame a page, and forms post only here.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${process.env.NODE_ENV === "development" ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

/** Sent with every answer, pages and API alike (OWASP Secure Headers Project, common practice). */
export const SECURITY_HEADERS = [
  { key: "Content-Security-Policy", value: CONTENT_SECURITY_POLICY },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
];

const nextConfig: NextConfig = {
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@libsql/client", "libsql", "nodemailer", "tinypool", "smtp-server", "mailparser", "bullmq", "ioredis"],
  // forbidden() from next/navigation: refusals render app/forbidden.tsx with HTTP status 403.
  experimental: { authInterrupts: true },
  // The framework's name tells a prober which exploits to try and tells a user nothing.
  poweredByHeader: false,
  async headers() {
    return [{ source: "/:path*", headers: SECURITY_HEADERS }];
  },
};

export default nextConfig;
