import type { Config } from 'tailwindcss';

/*
 * Hilum's own palette, named after the parts of a garden and of a seed.
 *   loam      warm soil neutrals: text, borders, quiet surfaces
 *   husk      dry straw and chaff: page and card backgrounds
 *   moss      the main action colour and "good" states
 *   clay      terracotta: errors, warnings, things that are down
 *   seedcoat  chestnut and amber: the seed mark and highlights
 *   frost     cold blue-grey: information, frost dates, focus rings
 *
 * Contrast ratios (WCAG 2.x, computed from these values) for the pairs the UI uses:
 *   loam-900 on husk-50 14.7 · loam-700 on husk-50 9.2 · loam-600 on husk-50 6.8
 *   white on moss-700 8.2 · moss-800 on moss-100 8.5 · white on clay-700 8.1
 *   clay-800 on clay-100 8.0 · frost-700 on husk-50 8.6 · seedcoat-800 on seedcoat-100 8.0
 * Keep body text at 600 or darker on the light surfaces (loam-500 is 4.8, large text only).
 */
const config = {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        loam: {
          50: '#f7f4ef',
          100: '#ede7dd',
          200: '#dcd2c3',
          300: '#c2b4a0',
          400: '#9e8d77',
          500: '#7d6d59',
          600: '#635645',
          700: '#4e4337',
          800: '#3b332a',
          900: '#2a241e',
          950: '#1b1713',
        },
        husk: {
          50: '#fcfaf4',
          100: '#f7f1e1',
          200: '#eee3c3',
          300: '#e2cf98',
          400: '#d2b46b',
          500: '#bf9a47',
          600: '#9f7c34',
          700: '#7d612b',
          800: '#614c25',
          900: '#4d3d20',
        },
        moss: {
          50: '#f2f6ec',
          100: '#e2ebd4',
          200: '#c6d8ab',
          300: '#a2bf7b',
          400: '#7ea356',
          500: '#61873c',
          600: '#4c6c2f',
          700: '#3d5626',
          800: '#324520',
          900: '#29391c',
          950: '#141e0c',
        },
        clay: {
          50: '#fbf3ef',
          100: '#f6e2d8',
          200: '#edc3af',
          300: '#e09c7f',
          400: '#d07655',
          500: '#bd5a37',
          600: '#a2462a',
          700: '#853824',
          800: '#6d3022',
          900: '#5b2a1f',
        },
        seedcoat: {
          50: '#fbf5ec',
          100: '#f5e6cf',
          200: '#ebcb9c',
          300: '#deab66',
          400: '#cd8d3f',
          500: '#b5742c',
          600: '#955c23',
          700: '#77491f',
          800: '#5f3b1c',
          900: '#4e3119',
        },
        frost: {
          50: '#f0f5f8',
          100: '#dde8ef',
          200: '#bcd2e0',
          300: '#8fb4ca',
          400: '#6091ae',
          500: '#447694',
          600: '#365e79',
          700: '#2d4d63',
          800: '#284153',
          900: '#243746',
        },
      },
      fontFamily: {
        sans: ["'Source Sans 3'", 'system-ui', 'sans-serif'],
      },
      minHeight: {
        tap: '2.75rem',
      },
      minWidth: {
        tap: '2.75rem',
      },
    },
  },
} satisfies Config;

export default config;
