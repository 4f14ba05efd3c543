const isDev = process.env.NODE_ENV !== 'production';

// Same-origin everything: no third-party hosts are ever needed (fonts ship in the repo).
const csp = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${isDev ? " 'unsafe-eval'" : ''}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

/** @type {import('next').NextConfig} */
const nextConfig = {
  // npm test builds into its own folder, so it never replaces the build a running npm start serves.
  distDir: process.env.NOOKPASS_DIST_DIR || '.next',
  poweredByHeader: false,
  reactStrictMode: true,
  // piscina starts its worker threads from its own files by path, which bundling would break.
  serverExternalPackages: ['pg', 'pino', 'bcrypt', '@react-pdf/renderer', 'sharp', 'smtp-server', 'mailparser', 'piscina', 'pg-boss'],
  async headers() {
    return [
      {
        source: '/:path*',
        headers: [
          { key: 'Content-Security-Policy', value: csp },
          { key: 'X-Content-Type-Options', value: 'nosniff' },
          { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
          { key: 'X-Frame-Options', value: 'DENY' },
          { key: 'Permissions-Policy', value: 'camera=(self), microphone=(), geolocation=()' },
        ],
      },
    ];
  },
};

export default nextConfig;
