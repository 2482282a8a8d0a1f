/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // The native SQLite binding and our per-connection PRAGMA hook must see the same module instance.
  serverExternalPackages: ['@libsql/client', 'libsql'],
  poweredByHeader: false,
  typedRoutes: false,
  async headers() {
    return [
      {
        source: '/:path*',
        headers: [
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
          { key: 'X-Frame-Options', value: 'DENY' },
        ],
      },
    ];
  },
};

export default nextConfig;
