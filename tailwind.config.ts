import type { Config } from 'tailwindcss'

/**
 * Fillwright's design tokens. A neutral "slate-ink" scale, one brand accent ("copper", the colour of a
 * brass-and-copper manifold), and three reserved safety states. A safety state is never shown by colour
 * alone: components pair it with an icon and a word (see src/components/ui/safety-badge.tsx).
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Inter"', 'system-ui', 'sans-serif'],
      },
      colors: {
        ink: {
          50: '#f6f7f8',
          100: '#eceef1',
          200: '#d5d9df',
          300: '#b1b8c2',
          400: '#8791a0',
          500: '#657083',
          600: '#4f596b',
          700: '#404857',
          800: '#2b313b',
          900: '#1b1f26',
          950: '#101318',
        },
        copper: {
          50: '#fbf4ef',
          100: '#f5e3d6',
          200: '#eac4aa',
          300: '#dc9d74',
          400: '#cf7a4b',
          500: '#b8602f',
          600: '#9a4c24',
          700: '#7c3c1f',
          800: '#64321d',
          900: '#522b1a',
        },
        blocked: { bg: '#fdecec', border: '#e5a3a3', fg: '#8f1d1d', solid: '#b42318' },
        caution: { bg: '#fff6e0', border: '#e8c56b', fg: '#6b4a00', solid: '#a86b00' },
        clear: { bg: '#e8f6ee', border: '#97d1ae', fg: '#125c33', solid: '#1f7a45' },
      },
      borderRadius: {
        card: '0.625rem',
      },
    },
  },
} satisfies Config
