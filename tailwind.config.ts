import type { Config } from 'tailwindcss';

// NookPass's own palette: drafting-paper neutrals, an ink blue for structure, and one signal colour per finding status.
export default {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f6f4ee', deep: '#ece8dd' },
        ink: { DEFAULT: '#1c2a3a', soft: '#3d4d60', faint: '#5b6673' },
        rule: '#d6d0c2',
        brass: { DEFAULT: '#8a5c12', soft: '#f3e6c8' },
        status: {
          pass: '#256a4c',
          fail: '#b23a2a',
          caution: '#875f00',
          info: '#4a58b8',
          na: '#646970',
        },
      },
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      boxShadow: { card: '0 1px 0 rgba(28,42,58,0.08), 0 1px 3px rgba(28,42,58,0.06)' },
    },
  },
  plugins: [],
} satisfies Config;
