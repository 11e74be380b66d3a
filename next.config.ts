import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@libsql/client", "libsql", "nodemailer", "tinypool", "smtp-server", "mailparser"],
};

export default nextConfig;
