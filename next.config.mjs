/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  experimental: {
    // forbidden() answers 403 from pages and server actions.
    authInterrupts: true,
    // Bodies pass through proxy.ts; let the largest accepted upload (a 20 MB import file, with its
    // form around it) reach the route, which answers 413 itself past its own limit.
    proxyClientMaxBodySize: "21mb",
  },
  serverExternalPackages: ["knex", "pg", "pg-boss", "pdfkit", "nodemailer"],
  turbopack: { root: import.meta.dirname },
};

export default nextConfig;
