/** @type {import('tailwindcss').Config} */
export default {
  content: ['./src/**/*.{astro,html,js,jsx,ts,tsx,md}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"Roboto Mono"', 'ui-monospace', 'monospace'],
      },
      colors: {
        // Roundsmith's own palette: forge ember on slate and hay.
        ember: { 50: '#fff5ed', 100: '#ffe7d4', 200: '#fdcaa8', 300: '#fba471', 400: '#f77338', 500: '#f45112', 600: '#e53708', 700: '#be2609', 800: '#971f10', 900: '#7a1c10' },
        slateblue: { 50: '#f4f6f8', 100: '#e3e8ee', 200: '#c9d3de', 300: '#a2b3c6', 400: '#748ca8', 500: '#56708e', 600: '#445a76', 700: '#394a60', 800: '#324051', 900: '#1f2833' },
        hay: { 50: '#fbf8ef', 100: '#f4ecd2', 200: '#e9d8a3', 300: '#dcbf6d', 400: '#d2a947', 500: '#c39035' },
      },
    },
  },
  plugins: [],
};
