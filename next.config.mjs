/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  experimental: {
    // forbidden() answers 403 from pages and server actions.
    authInterrupts: true,
  },
  serverExternalPackages: ["knex", "pg", "pg-boss", "pdfkit", "nodemailer"],
  turbopack: { root: import.meta.dirname },
};

export default nextConfig;
