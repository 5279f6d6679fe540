import type { Config } from 'tailwindcss'

// Pomewright's own palette: orchard greens, pressed-juice amber, cellar slate.
export default {
  content: [],
  theme: {
    extend: {
      fontFamily: {
        serif: ['"Crimson Pro"', 'Georgia', 'serif'],
        sans: ['"Crimson Pro"', 'Georgia', 'serif'],
      },
      colors: {
        leaf: { 50: '#f2f7ef', 100: '#dfeed8', 200: '#bfdcb2', 400: '#6fa35a', 600: '#3f6f2f', 700: '#325a26', 800: '#27461f', 900: '#1d3418' },
        must: { 50: '#fdf8ec', 100: '#f9ecc9', 300: '#eecb73', 500: '#d99a2b', 600: '#b87a1c', 700: '#8e5b17' },
        cellar: { 50: '#f5f5f3', 100: '#e8e7e3', 300: '#bdbab1', 500: '#77746a', 700: '#45433d', 900: '#22211e' },
        rind: { 500: '#b5432f', 600: '#953523' },
      },
    },
  },
} satisfies Config
