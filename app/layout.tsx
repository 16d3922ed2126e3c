import type { Metadata, Viewport } from 'next';
import { headers } from 'next/headers';
import { serif, sans, mono } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Notchwise', template: '%s · Notchwise' },
  description: 'Find how deep a discount must be, at each regular price, before shoppers notice it.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1, themeColor: '#FAF7F2' };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: its scripts need this request's CSP nonce (proxy.ts).
  await headers();
  return (
    <html lang="en" className={`${serif.variable} ${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen bg-paper text-ink antialiased">{children}</body>
    </html>
  );
}
