import type { Metadata, Viewport } from 'next';
import '@/app/globals.css';
import { mono, sans } from '@/app/fonts';

export const metadata: Metadata = {
  title: { default: 'NookPass', template: '%s · NookPass' },
  description: 'Plan a laundry closet, check it against the adopted codes before you build, and hand the inspector a cited report.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body>
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
          Skip to content
        </a>
        {children}
      </body>
    </html>
  );
}
