import localFont from 'next/font/local';

// Shipped in public/fonts (SIL OFL 1.1); nothing is fetched at build or run time.
export const inter = localFont({
  src: [
    { path: '../public/fonts/Inter-Variable.woff2', weight: '100 900', style: 'normal' },
    { path: '../public/fonts/Inter-Variable-LatinExt.woff2', weight: '100 900', style: 'normal' },
  ],
  variable: '--font-inter',
  display: 'swap',
});

export const mono = localFont({
  src: [
    { path: '../public/fonts/JetBrainsMono-Regular.woff2', weight: '400', style: 'normal' },
    { path: '../public/fonts/JetBrainsMono-SemiBold.woff2', weight: '600', style: 'normal' },
  ],
  variable: '--font-mono',
  display: 'swap',
});
