/** @type {import('next').NextConfig} */
const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
];

const nextConfig = {
  // knex loads optional drivers dynamically; bundling it (or pg, bullmq, ioredis) breaks the build.
  serverExternalPackages: ["knex", "pg", "bullmq", "ioredis", "@node-rs/argon2", "smtp-server", "mailparser", "nodemailer"],
  // a separate build folder lets a test build run beside a `npm start` build
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};

export default nextConfig;
