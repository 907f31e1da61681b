import type { Config } from 'tailwindcss'

// Perpend's own palette: slate ink on warm lime-mortar paper, a fired-clay accent.
// Every text/background pair used in the UI keeps WCAG AA contrast (ink-700 on mortar-50 is 10:1,
// clay-700 on white 6.6:1, white on clay-700 6.6:1).
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
    './app.vue',
    './error.vue',
    './content/**/*.md',
  ],
  theme: {
    extend: {
      colors: {
        ink: {
          950: '#0f171e',
          900: '#17212b',
          800: '#22303c',
          700: '#2f3d4a',
          600: '#44535f',
          500: '#5a6b7a',
          300: '#a9b4bd',
          200: '#cbd3d9',
          100: '#e4e8eb',
        },
        mortar: {
          50: '#faf8f3',
          100: '#f2eee4',
          200: '#e4ddcc',
          300: '#d2c7ae',
        },
        clay: {
          800: '#7d3316',
          700: '#9a3f1c',
          600: '#b4501f',
          500: '#cc6a35',
          100: '#f7e3d6',
        },
        moss: { 700: '#3f6b2a', 100: '#e3eed9' },
        amber: { 800: '#7a4f00', 100: '#fbefd2' },
        alert: { 700: '#a3221b', 100: '#f9dedb' },
      },
      fontFamily: {
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        'caption': ['0.8125rem', { lineHeight: '1.15rem' }],
        'body': ['1rem', { lineHeight: '1.55rem' }],
        'lead': ['1.1875rem', { lineHeight: '1.75rem' }],
        'title-s': ['1.375rem', { lineHeight: '1.8rem', fontWeight: '600' }],
        'title-m': ['1.75rem', { lineHeight: '2.2rem', fontWeight: '600' }],
        'title-l': ['2.375rem', { lineHeight: '2.8rem', fontWeight: '700' }],
      },
      maxWidth: { page: '76rem' },
    },
  },
  plugins: [],
} satisfies Config
