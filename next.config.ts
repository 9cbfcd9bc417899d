import type { NextConfig } from "next";

/**
 * Uploads (cable schedules, ampacity tables, imported bus networks) arrive through
 * server actions; each upload checks its own, smaller limit and says so in plain words.
 * These two limits only keep the framework from cutting a body off before that check.
 */
const UPLOAD_BODY_LIMIT = "40mb";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // The type check runs once in `npm test` (tsc --noEmit); the build would repeat it.
  typescript: { ignoreBuildErrors: false },
  experimental: { serverActions: { bodySizeLimit: UPLOAD_BODY_LIMIT }, proxyClientMaxBodySize: UPLOAD_BODY_LIMIT },
};

export default nextConfig;
