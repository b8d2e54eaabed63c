import type { Config } from 'tailwindcss';
import plugin from 'tailwindcss/plugin';

/**
 * Luxtempo's visual identity: warm paper-like greys for every surface, one violet accent
 * ("iris") for action and place, and a red ("alarm") kept for errors only. Text pairs used in
 * the app were checked against WCAG AA: paper-600 and darker on paper-50/100/white ≥ 5.7:1,
 * white on iris-700 9.8:1, iris-700 on paper-50 9.2:1, alarm-700 on white 8.1:1. paper-500 is
 * for borders (4.2:1 on white), never for text.
 */
const paper = {
  50: '#faf8f5',
  100: '#f3f0eb',
  200: '#e6e1d9',
  300: '#d3ccc1',
  400: '#aaa194',
  500: '#837a6d',
  600: '#655d52',
  700: '#4e473e',
  800: '#37322b',
  900: '#26221d',
  950: '#171411',
};

const iris = {
  50: '#f5f2fc',
  100: '#ebe4f9',
  200: '#d6c9f2',
  300: '#b7a0e6',
  400: '#9474d6',
  500: '#7650c2',
  600: '#6139ad',
  700: '#512c95',
  800: '#42247a',
  900: '#341d5f',
  950: '#211139',
};

const alarm = {
  50: '#fdf3f2',
  100: '#fae3e0',
  200: '#f3c1bb',
  600: '#b4321f',
  700: '#962717',
  800: '#7a2014',
};

export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: { paper, iris, alarm },
      fontFamily: {
        sans: ['Lexend', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      fontSize: {
        // The step clock must be readable from about two metres at the bedside.
        clock: [
          'clamp(5rem, 16vw, 12rem)',
          { lineHeight: '1', letterSpacing: '-0.02em', fontWeight: '600' },
        ],
        'clock-sm': [
          'clamp(3rem, 8vw, 6rem)',
          { lineHeight: '1', letterSpacing: '-0.01em', fontWeight: '600' },
        ],
      },
      minHeight: {
        // Comfortable touch target on a bedside tablet.
        tap: '2.75rem',
      },
    },
  },
  plugins: [
    plugin(({ addUtilities }) => {
      addUtilities({
        // Digits of equal width so a running clock does not jitter as numbers change.
        '.numerals-steady': {
          'font-variant-numeric': 'tabular-nums lining-nums',
          'font-feature-settings': '"tnum" 1, "lnum" 1',
        },
      });
    }),
  ],
} satisfies Config;
