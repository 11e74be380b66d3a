import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@libsql/client", "libsql", "nodemailer", "tinypool", "smtp-server", "mailparser", "bullmq", "ioredis"],
  // forbidden() from next/navigation: refusals render app/forbidden.tsx with HTTP status 403.
  experimental: { authInterrupts: true },
};

export default nextConfig;
