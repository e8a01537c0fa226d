import type { Metadata } from 'next';
import { connection } from 'next/server';
import './globals.css';
import { mono, sans } from './fonts';
import { Providers } from './providers';

export const metadata: Metadata = {
  title: { default: 'Phasewright', template: '%s · Phasewright' },
  description: 'Shape, review and hand off the feedback loop of DC-DC converters.',
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request: proxy.ts gives each response a fresh script nonce, which Next
  // puts on its inline scripts only while rendering (a page built ahead would carry none).
  await connection();
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
