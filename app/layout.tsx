import type { Metadata, Viewport } from 'next';
import { headers } from 'next/headers';
import type { ReactNode } from 'react';
import { Providers } from '@/components/providers';
import { inter, mono } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Denudata', template: '%s · Denudata' },
  description: 'A shared, versioned notebook of reproducible erosion calculations.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

// The theme is read before paint so a dark-theme user never sees a light flash.
const themeScript = `try{var t=localStorage.getItem('denudata-theme');if(t==='dark'||(!t&&matchMedia('(prefers-color-scheme: dark)').matches))document.documentElement.dataset.theme='dark'}catch(e){}`;

// Every page renders per request: its scripts carry the request's CSP nonce (set by proxy.ts).
export default async function RootLayout({ children }: { children: ReactNode }) {
  const nonce = (await headers()).get('x-nonce') ?? undefined;
  return (
    <html lang="en" className={`${inter.variable} ${mono.variable}`} suppressHydrationWarning>
      <head>
        <script nonce={nonce} dangerouslySetInnerHTML={{ __html: themeScript }} />
      </head>
      <body className="min-h-screen bg-paper text-basalt antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
