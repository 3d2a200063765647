import type { Config } from 'tailwindcss'
import plugin from 'tailwindcss/plugin'

/**
 * Source Sans 3, from @fontsource/source-sans-3's files: the weights pages use in the subsets their words need
 * (Latin, Latin Extended, Greek for σ and γ), with the package's Unicode ranges.
 *
 * font-display: optional, not the package's swap. With swap, a face that arrived after the first paint set the text
 * again in wider or narrower lines and everything under it moved (a phone's stress-model page moved by a fifth of the
 * screen). With optional the text is drawn once: in this face when it is there within a moment (the regular and
 * semibold Latin faces are preloaded with the page, app/plugins/font-preload.server.ts), else that page stays in the
 * device's own sans-serif, and the faces come in with the visit's first navigation (app/plugins/web-font-swap.client.ts).
 */
const FONT_SUBSETS: Record<string, string> = {
  'latin': 'U+0000-00FF,U+0131,U+0152-0153,U+02BB-02BC,U+02C6,U+02DA,U+02DC,U+0304,U+0308,U+0329,U+2000-206F,U+20AC,U+2122,U+2191,U+2193,U+2212,U+2215,U+FEFF,U+FFFD',
  'latin-ext': 'U+0100-02BA,U+02BD-02C5,U+02C7-02CC,U+02CE-02D7,U+02DD-02FF,U+0304,U+0308,U+0329,U+1D00-1DBF,U+1E00-1E9F,U+1EF2-1EFF,U+2020,U+20A0-20AB,U+20AD-20C0,U+2113,U+2C60-2C7F,U+A720-A7FF',
  'greek': 'U+0370-0377,U+037A-037F,U+0384-038A,U+038C,U+038E-03A1,U+03A3-03FF',
}
const FONT_WEIGHTS = [400, 600, 700]
const fontFaces = plugin(({ addBase }) => {
  addBase(Object.entries(FONT_SUBSETS).flatMap(([subset, unicodeRange]) => FONT_WEIGHTS.map(weight => ({
    '@font-face': {
      fontFamily: "'Source Sans 3'",
      fontStyle: 'normal',
      fontWeight: String(weight),
      fontDisplay: 'optional',
      src: `url('@fontsource/source-sans-3/files/source-sans-3-${subset}-${weight}-normal.woff2') format('woff2')`,
      unicodeRange,
    },
  }))))
})

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
  plugins: [fontFaces],
  // Tailwind's per-element defaults (about fifty --tw-* custom properties for transforms, rings, shadows, filters…)
  // are set only on the elements whose classes use them, not on every element and pseudo-element (`*, ::before,
  // ::after`): the browser's first style pass over a page holding the server's drawing took 47 ms with them on every
  // element. A component's own <style> block must therefore not @apply a utility that reads those defaults (rings,
  // shadows, transforms, filters), nor may a base rule apply one to a selector with no element part (`:focus-visible`);
  // tests/unit/app/tailwind-defaults.test.ts checks both.
  experimental: { optimizeUniversalDefaults: true },
} satisfies Config
