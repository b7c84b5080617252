import type { Config } from 'tailwindcss';

/**
 * Spoolwright's own identity: graphite neutrals and one warm accent, the colour of enamelled
 * copper magnet wire. Status colours are never the only signal — components pair them with a
 * word and a shape (see src/components/Status.tsx).
 *
 * Loaded from src/index.css with `@config "../tailwind.config.ts";` (Tailwind 4).
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        graphite: {
          50: '#f5f6f7',
          100: '#e9ebed',
          200: '#d3d7db',
          300: '#b2b8be',
          400: '#8a929a',
          500: '#6b737b',
          600: '#545b62',
          700: '#42474d',
          800: '#2e3236',
          900: '#1f2225',
          950: '#141618',
        },
        copper: {
          50: '#fbf4ee',
          100: '#f5e3d3',
          200: '#ebc4a4',
          300: '#dd9f70',
          400: '#cf7d47',
          500: '#b8632e',
          600: '#9a4f23',
          700: '#7c3f1e',
          800: '#5f311a',
          900: '#472613',
        },
        // Semantic status colours (always with text and a shape).
        ok: { DEFAULT: '#2d6e4a', soft: '#e3f1e8' },
        caution: { DEFAULT: '#8a5a00', soft: '#fbf0d6' },
        fault: { DEFAULT: '#a8261f', soft: '#fbe5e3' },
      },
      fontFamily: {
        // Barlow is shipped (weights 400–700); Noto Sans (latin + greek, shipped) draws the
        // symbols Barlow lacks: Ω, µ, ±, ², °.
        sans: ['Barlow', 'Noto Sans', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
      },
      minHeight: { touch: '3rem' },
    },
  },
} satisfies Config;
