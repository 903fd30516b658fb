import localFont from 'next/font/local';

// Both faces ship inside npm font packages (SIL Open Font License); nothing is fetched at build or run time.
export const displayFont = localFont({
  src: '../node_modules/@fontsource-variable/bricolage-grotesque/files/bricolage-grotesque-latin-wght-normal.woff2',
  variable: '--font-display',
  weight: '200 800',
  display: 'swap',
});

export const bodyFont = localFont({
  src: [
    { path: '../node_modules/@fontsource-variable/public-sans/files/public-sans-latin-wght-normal.woff2', style: 'normal' },
    { path: '../node_modules/@fontsource-variable/public-sans/files/public-sans-latin-wght-italic.woff2', style: 'italic' },
  ],
  variable: '--font-body',
  weight: '100 900',
  display: 'swap',
});
