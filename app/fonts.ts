import localFont from 'next/font/local';

// Shipped in fonts/ (OFL licences beside the files); nothing is fetched at build or run time.
export const serif = localFont({ src: '../fonts/source-serif-4-latin.woff2', variable: '--font-serif', display: 'swap', weight: '200 900' });
export const sans = localFont({
  src: [
    { path: '../fonts/source-sans-3-latin.woff2', style: 'normal', weight: '200 900' },
    { path: '../fonts/source-sans-3-latin-italic.woff2', style: 'italic', weight: '200 900' },
  ],
  variable: '--font-sans',
  display: 'swap',
});
export const mono = localFont({ src: '../fonts/jetbrains-mono-latin.woff2', variable: '--font-mono', display: 'swap', weight: '100 800' });
