import type { Config } from 'tailwindcss';

// Lacewright design tokens: the only colours, type sizes and radii the UI uses.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}', './lib/**/*.{ts,tsx}'],
  theme: {
    colors: {
      transparent: 'transparent',
      current: 'currentColor',
      white: '#ffffff',
      // Warm paper backgrounds.
      chalk: { 50: '#fbf8f3', 100: '#f4efe6', 200: '#e8e0d2', 300: '#d6cab6' },
      // Text and lines: a blue-grey ink.
      ink: { 300: '#a0a8b5', 500: '#5a6474', 700: '#353f4f', 900: '#1b2230' },
      // Primary: a deep petrol green, like an anodised hub shell.
      petrol: { 50: '#e3f1ef', 100: '#c4e2de', 500: '#17716f', 600: '#0f5d5c', 700: '#0b4847', 900: '#06302f' },
      // Accent: polished brass, for highlights and the name mark.
      brass: { 100: '#f8ecd3', 300: '#e6c27a', 500: '#b98a2e', 700: '#7d5a14' },
      // States.
      rust: { 50: '#fbe9e3', 500: '#b4441f', 700: '#8a2f12' },
      moss: { 50: '#e8f1e1', 500: '#4a7a2f', 700: '#335820' },
      amber: { 50: '#fdf3dc', 500: '#c18a0f', 700: '#7a5500' },
    },
    fontFamily: {
      display: ['var(--font-display)', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      sans: ['var(--font-body)', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
    },
    // A 1.2 modular scale from 16 px.
    fontSize: {
      xs: ['0.75rem', { lineHeight: '1rem' }],
      sm: ['0.875rem', { lineHeight: '1.3rem' }],
      base: ['1rem', { lineHeight: '1.55rem' }],
      lg: ['1.2rem', { lineHeight: '1.75rem' }],
      xl: ['1.44rem', { lineHeight: '1.9rem' }],
      '2xl': ['1.728rem', { lineHeight: '2.2rem' }],
      '3xl': ['2.074rem', { lineHeight: '2.5rem' }],
      '4xl': ['2.488rem', { lineHeight: '2.8rem' }],
    },
    borderRadius: { none: '0', sm: '3px', DEFAULT: '6px', lg: '10px', full: '9999px' },
    extend: {
      boxShadow: { card: '0 1px 0 rgba(27,34,48,0.06), 0 2px 8px rgba(27,34,48,0.06)' },
      maxWidth: { page: '72rem' },
    },
  },
};

export default config;
