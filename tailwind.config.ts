// Kerfbook's palette and type scale, set once here. High contrast for a bright, dusty shop floor.
import type { Config } from 'tailwindcss'

export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
    './app.vue',
    './error.vue',
  ],
  theme: {
    extend: {
      colors: {
        // Ink and paper: near-black on warm off-white reads through dust and glare.
        ink: { DEFAULT: '#15191c', soft: '#3b4349', muted: '#5d666d' },
        paper: { DEFAULT: '#f6f4ee', raised: '#ffffff', sunk: '#e9e5da', line: '#cfc8b8' },
        // Spruce: the brand colour, a deep green taken from freshly cut softwood's shadow.
        spruce: {
          50: '#eef7f4', 100: '#d3ebe3', 200: '#a6d6c7', 300: '#6fbba6', 400: '#3f9b84',
          500: '#237e69', 600: '#176553', 700: '#135244', 800: '#12302b', 900: '#0b1f1b',
        },
        // Chip: a safety amber for attention (due, waiting, low stock).
        chip: { 50: '#fff7e6', 100: '#ffe9b8', 400: '#f5b423', 500: '#e09a00', 700: '#8a5a00', 800: '#6b4500' },
        // Ember: breakage, melted plastic, destructive actions.
        ember: { 50: '#fdeeec', 100: '#f9d3ce', 500: '#c8321f', 600: '#a82716', 700: '#861e11' },
        // Cutter states, each distinct in hue and lightness so they survive a dim screen.
        state: {
          crib: '#176553',
          spindle: '#1d4ed8',
          regrind: '#7c3aed',
          retired: '#5d666d',
          lost: '#a82716',
        },
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
        display: ['"Barlow Condensed"', '"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'Consolas', 'monospace'],
      },
      fontSize: {
        // A scale one step larger than usual: phones at arm's length, gloves on.
        'xs': ['0.8125rem', { lineHeight: '1.15rem' }],
        'sm': ['0.9375rem', { lineHeight: '1.35rem' }],
        'base': ['1.0625rem', { lineHeight: '1.6rem' }],
        'lg': ['1.25rem', { lineHeight: '1.75rem' }],
        'xl': ['1.5rem', { lineHeight: '2rem' }],
        '2xl': ['1.875rem', { lineHeight: '2.25rem' }],
        '3xl': ['2.375rem', { lineHeight: '2.6rem' }],
        '4xl': ['3rem', { lineHeight: '3.1rem' }],
      },
      minHeight: { touch: '3.25rem' },
      minWidth: { touch: '3.25rem' },
      borderRadius: { card: '0.875rem' },
      boxShadow: { card: '0 1px 0 rgba(21,25,28,0.06), 0 1px 3px rgba(21,25,28,0.08)' },
    },
  },
  plugins: [],
} satisfies Config
