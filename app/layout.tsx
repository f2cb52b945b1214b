import type { Metadata, Viewport } from 'next';
import localFont from 'next/font/local';
import { connection } from 'next/server';
import './globals.css';

const body = localFont({
  src: [
    { path: '../fonts/public-sans-latin-wght.woff2', style: 'normal', weight: '100 900' },
    { path: '../fonts/public-sans-latin-wght-italic.woff2', style: 'italic', weight: '100 900' },
  ],
  variable: '--font-body',
  display: 'swap',
});

const display = localFont({
  src: '../fonts/space-grotesk-latin-wght.woff2',
  weight: '300 700',
  variable: '--font-display',
  display: 'swap',
});

export const metadata: Metadata = {
  title: { default: 'Fishplate', template: '%s · Fishplate' },
  description: 'Plan operating sessions for microcontroller-driven model railways, check them and invite the crew.',
};

export const viewport: Viewport = {
  themeColor: [
    { media: '(prefers-color-scheme: light)', color: '#f5f1e8' },
    { media: '(prefers-color-scheme: dark)', color: '#101618' },
  ],
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Rendered per request, never at build time: Next puts the request's CSP nonce (proxy.ts) on its
  // scripts only while rendering, so a page prerendered without one would have every script blocked.
  await connection();
  return (
    <html lang="en" className={`${body.variable} ${display.variable}`}>
      <body className="min-h-dvh bg-paper font-sans text-ink antialiased">{children}</body>
    </html>
  );
}
