import type { Metadata } from 'next';
import { greek, mono, sans } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Lattice Ledger', template: '%s · Lattice Ledger' },
  description: 'Computed phonon frequencies and vibrational entropies, held against experiment with their sources.',
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${greek.variable} ${mono.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
