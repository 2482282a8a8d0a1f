/**
 * HSTS_MAX_AGE (seconds, read when the app is built): default two years; 0 turns HSTS off.
 * @param {string | undefined} raw
 */
function hstsHeader(raw) {
  const seconds = raw === undefined || raw === '' ? 63072000 : Number(raw);
  if (!Number.isInteger(seconds) || seconds < 0) throw new Error(`HSTS_MAX_AGE must be a whole number of seconds, got "${raw}".`);
  return seconds === 0 ? null : `max-age=${seconds}; includeSubDomains`;
}

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // The native SQLite binding and our per-connection PRAGMA hook must see the same module instance.
  // moyo-wasm (space groups, lib/structure/symmetry.ts) is a web-target WebAssembly build: bundled, Turbopack
  // turns its .wasm into a module it cannot resolve; loaded from node_modules, our loader reads the bytes itself.
  serverExternalPackages: ['@libsql/client', 'libsql', '@spglib/moyo-wasm'],
  poweredByHeader: false,
  typedRoutes: false,
  async headers() {
    const hsts = hstsHeader(process.env.HSTS_MAX_AGE);
    return [
      {
        source: '/:path*',
        headers: [
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
          { key: 'X-Frame-Options', value: 'DENY' },
        ],
      },
      // Pages get a nonce-based policy from proxy.ts; API answers are data and may load nothing.
      { source: '/api/:path*', headers: [{ key: 'Content-Security-Policy', value: "default-src 'none'; frame-ancestors 'none'" }] },
      // Strict-Transport-Security only on answers that went out over https (a TLS-terminating proxy
      // says so in X-Forwarded-Proto); over plain http browsers ignore it anyway.
      ...(hsts ? [{ source: '/:path*', has: [{ type: 'header', key: 'x-forwarded-proto', value: 'https' }], headers: [{ key: 'Strict-Transport-Security', value: hsts }] }] : []),
    ];
  },
};

export default nextConfig;
