import localFont from 'next/font/local';

// Shipped from npm (@fontsource-variable), never fetched from a font CDN.
export const sans = localFont({
  src: '../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2',
  variable: '--font-inter',
  weight: '100 900',
  display: 'swap',
});

// Γ, ω, ε, ν …: the Greek subset, placed after the Latin one in the font stack (the browser falls back per glyph).
export const greek = localFont({
  src: '../node_modules/@fontsource-variable/inter/files/inter-greek-wght-normal.woff2',
  variable: '--font-inter-greek',
  weight: '100 900',
  display: 'swap',
});

export const mono = localFont({
  src: '../node_modules/@fontsource-variable/jetbrains-mono/files/jetbrains-mono-latin-wght-normal.woff2',
  variable: '--font-jetbrains',
  weight: '100 800',
  display: 'swap',
});
