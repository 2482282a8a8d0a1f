import type { Metadata } from 'next';
import { connection } from 'next/server';
import { greek, mono, sans } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Lattice Ledger', template: '%s · Lattice Ledger' },
  description: 'Computed phonon frequencies and vibrational entropies, held against experiment with their sources.',
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page is rendered per request: its scripts carry the nonce of that request's Content-Security-Policy (proxy.ts).
  await connection();
  return (
    <html lang="en" className={`${sans.variable} ${greek.variable} ${mono.variable}`}>
      <body className="min-h-screen">
        <a
          href="#main"
          className="sr-only rounded-md bg-accent px-3 py-2 text-sm font-medium text-white no-underline focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-[100]"
        >
          Skip to main content
        </a>
        {children}
      </body>
    </html>
  );
}
