import type { Config } from 'tailwindcss'
import { caution, danger, ink, primary, riskRamp } from './shared/theme'

const ramp = Object.fromEntries(riskRamp.map((c, i) => [String(i), c]))

export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './app.vue',
    './composables/**/*.ts',
    './shared/**/*.ts',
  ],
  theme: {
    extend: {
      fontFamily: { sans: ['Lato', 'system-ui', 'sans-serif'] },
      colors: { ink, primary, caution, danger, risk: ramp },
    },
  },
  plugins: [],
} satisfies Config
