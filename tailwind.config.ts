import type { Config } from 'tailwindcss';

/**
 * Tenthmark's own look: a warm paper ground, deep blue-slate ink, and a
 * brass accent taken from the colour of fresh-honed cast iron under shop light.
 * Colours meet WCAG 2.1 AA for text where they are used as text.
 */
export default {
  content: ['./index.html', './client/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['Manrope', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
      },
      colors: {
        paper: { DEFAULT: '#f3f1ec', raised: '#fbfaf7', sunk: '#e7e3da' },
        ink: { DEFAULT: '#16232d', soft: '#3b4a55', faint: '#56636d' },
        slate: {
          50: '#eef3f6',
          100: '#d8e3ea',
          200: '#b3c8d5',
          300: '#86a6ba',
          400: '#5a829b',
          500: '#3d6580',
          600: '#2b5470',
          700: '#1d4e6b',
          800: '#173d54',
          900: '#112c3d',
        },
        brass: {
          50: '#fbf4e8',
          100: '#f4e2c2',
          200: '#e9c487',
          300: '#dba451',
          400: '#c98a2c',
          500: '#b8741a',
          600: '#975c12',
          700: '#76470f',
          800: '#56340c',
          900: '#3a2308',
        },
        pass: { DEFAULT: '#1e6b3a', soft: '#e3f1e7' },
        fail: { DEFAULT: '#a3261b', soft: '#f8e4e1' },
        caution: { DEFAULT: '#7a5a00', soft: '#fbf1d4' },
      },
      fontSize: {
        // A modular scale (1.2) that stays readable on a shop-floor tablet.
        xs: ['0.78rem', { lineHeight: '1.1rem' }],
        sm: ['0.875rem', { lineHeight: '1.3rem' }],
        base: ['1rem', { lineHeight: '1.55rem' }],
        lg: ['1.2rem', { lineHeight: '1.7rem' }],
        xl: ['1.44rem', { lineHeight: '1.9rem' }],
        '2xl': ['1.73rem', { lineHeight: '2.2rem' }],
        '3xl': ['2.07rem', { lineHeight: '2.5rem' }],
        '4xl': ['2.49rem', { lineHeight: '2.9rem' }],
      },
      borderRadius: { card: '0.75rem' },
      boxShadow: { card: '0 1px 2px rgb(22 35 45 / 0.06), 0 4px 14px rgb(22 35 45 / 0.06)' },
      maxWidth: { page: '72rem' },
    },
  },
} satisfies Config;
