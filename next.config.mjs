/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize and pdfmake load optional dependencies dynamically; bundling them breaks the build.
  serverExternalPackages: ["sequelize", "pdfmake", "pg", "pg-hstore"],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
