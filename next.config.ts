import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  serverExternalPackages: ["knex", "mysql2", "bullmq", "ioredis", "meyda", "wavefile", "music-metadata", "busboy", "smtp-server"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
