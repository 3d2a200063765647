import type { Config } from 'tailwindcss'

// Pastload's visual identity: a deep "tide" blue-green for structure and action,
// "ochre" for attention and the σ'p line, warm "silt" neutrals for paper-like panels.
export default {
  content: [
    './app/**/*.{vue,ts}',
    './shared/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        tide: {
          50: '#eef7f8', 100: '#d5ecef', 200: '#acd8de', 300: '#7bbcc6', 400: '#4d9aa8',
          500: '#317d8c', 600: '#246575', 700: '#1f5261', 800: '#1c4450', 900: '#183a44', 950: '#0c242b',
        },
        ochre: {
          50: '#fcf7ec', 100: '#f7eacb', 200: '#efd394', 300: '#e5b65c', 400: '#dc9c38',
          500: '#c98024', 600: '#ab621c', 700: '#8a481a', 800: '#713a1b', 900: '#5e311a',
        },
        silt: {
          50: '#f8f7f4', 100: '#efede7', 200: '#dfdacf', 300: '#c9c1b0', 400: '#ada18b',
          500: '#978a72', 600: '#766a57', 700: '#675d4f', 800: '#564e44', 900: '#48423a', 950: '#27231f',
        },
        alert: { 50: '#fdf2f2', 500: '#c0392b', 700: '#922b21' },
        good: { 50: '#eef8f1', 500: '#2e8b57', 700: '#216641' },
      },
      fontFamily: {
        sans: ['"Source Sans 3"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
      },
      fontSize: {
        'xs': ['0.75rem', { lineHeight: '1rem' }],
        'sm': ['0.875rem', { lineHeight: '1.3rem' }],
        'base': ['1rem', { lineHeight: '1.5rem' }],
        'lg': ['1.125rem', { lineHeight: '1.6rem' }],
        'xl': ['1.35rem', { lineHeight: '1.8rem' }],
        '2xl': ['1.7rem', { lineHeight: '2.1rem' }],
      },
      spacing: {
        rail: '15rem',
      },
      borderRadius: {
        card: '0.625rem',
      },
      boxShadow: {
        card: '0 1px 2px rgba(39, 35, 31, 0.06), 0 1px 6px rgba(39, 35, 31, 0.05)',
      },
    },
  },
  plugins: [],
} satisfies Config
