import type { Config } from 'tailwindcss';

// Denudata's palette: earth materials, light first, dark derived (see DEVELOPERS.md, "Look").
// Colours are CSS variables set in app/globals.css so one class serves both themes.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}', './lib/**/*.{ts,tsx}'],
  darkMode: ['class', '[data-theme="dark"]'],
  theme: {
    extend: {
      colors: {
        paper: 'var(--paper)',
        chalk: 'var(--chalk)',
        basalt: 'var(--basalt)',
        slate: 'var(--slate)',
        rule: 'var(--rule)',
        river: 'var(--river)',
        'river-ink': 'var(--river-ink)',
        ochre: 'var(--ochre)',
        moss: 'var(--moss)',
        clay: 'var(--clay)',
        oxide: 'var(--oxide)',
        wash: 'var(--wash)',
      },
      fontFamily: {
        sans: ['var(--font-inter)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      fontSize: { dense: ['13px', '18px'] },
    },
  },
};

export default config;
