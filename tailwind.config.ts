import type { Config } from 'tailwindcss';

// Palette per the product glossary: ink-blue frame, white work surfaces;
// loop gain indigo, power stage teal, compensator amber, bench data grey.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      colors: {
        frame: { DEFAULT: '#1e2a4a', dark: '#141c33', light: '#2c3b63' },
        trace: { loop: '#4f46e5', plant: '#0d9488', comp: '#d97706', bench: '#6b7280', rhp: '#dc2626' },
      },
    },
  },
  plugins: [],
};

export default config;
