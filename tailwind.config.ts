import type { Config } from 'tailwindcss'

// Colours are CSS variables (app/assets/css/main.css) so the sunlight and night themes swap
// with one class on <html>; names say what a colour is for, not what it looks like.
const v = (name: string) => `rgb(var(--w-${name}) / <alpha-value>)`

export default {
  content: ['./app/**/*.{vue,ts}', './shared/**/*.ts'],
  darkMode: ['class', '.theme-night'],
  theme: {
    extend: {
      colors: {
        'page': v('page'),
        'panel': v('panel'),
        'ink': v('ink'),
        'muted': v('muted'),
        'rule': v('rule'),
        'brand': v('brand'),
        'brand-ink': v('brand-ink'),
        'action': v('action'),
        'action-ink': v('action-ink'),
        'ok': v('ok'),
        'caution': v('caution'),
        'fault': v('fault'),
        'info': v('info'),
        'wait': v('wait'),
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
      },
      minHeight: { tap: '3rem' },
      minWidth: { tap: '3rem' },
      borderRadius: { card: '0.375rem' },
    },
  },
  plugins: [],
} satisfies Config
