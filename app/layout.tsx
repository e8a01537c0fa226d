import type { Metadata } from 'next';
import './globals.css';
import { mono, sans } from './fonts';
import { Providers } from './providers';

export const metadata: Metadata = {
  title: { default: 'Phasewright', template: '%s · Phasewright' },
  description: 'Shape, review and hand off the feedback loop of DC-DC converters.',
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${sans.variable} ${mono.variable}`}>
      <body className="min-h-screen font-sans">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
