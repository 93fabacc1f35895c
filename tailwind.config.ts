import type { Config } from 'tailwindcss';

/**
 * Loftwise's own palette and type. Loaded by src/app.css through `@config`
 * (Tailwind 4 reads a JS config only through that directive).
 */
export default {
  content: ['./src/**/*.{html,svelte,ts}'],
  theme: {
    extend: {
      colors: {
        // "ink": the deep blue-grey of a pre-dawn sky, for text and the chrome.
        ink: {
          50: '#f3f6f8',
          100: '#e4eaef',
          200: '#c9d4de',
          300: '#a2b3c3',
          400: '#7188a0',
          500: '#536b84',
          600: '#40546b',
          700: '#334356',
          800: '#232f3d',
          900: '#161e28',
          950: '#0d1219'
        },
        // "loft": the product colour, a saturated teal.
        loft: {
          50: '#eefbfa',
          100: '#d3f4f1',
          200: '#a9e8e3',
          300: '#72d5cf',
          400: '#3dbab4',
          500: '#1f9d98',
          600: '#167e7c',
          700: '#156565',
          800: '#165152',
          900: '#164445',
          950: '#07292a'
        },
        // "flare": the highlight colour for the Pareto front and calls to action.
        flare: {
          50: '#fff8ec',
          100: '#ffefd2',
          200: '#ffdba4',
          300: '#ffc06b',
          400: '#ff9a30',
          500: '#fc7c0a',
          600: '#e06100',
          700: '#b94803',
          800: '#93380b',
          900: '#76300c',
          950: '#401604'
        },
        good: '#1f6f40',
        caution: '#9a6700',
        fault: '#c2412d'
      },
      fontFamily: {
        sans: ['"Inter Variable"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono Variable"', 'ui-monospace', 'monospace']
      }
    }
  }
} satisfies Config;
