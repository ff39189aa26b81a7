// The one place colours are defined: Tailwind's theme and the charts both read from here.

export const ink = {
  50: '#f6f7f9', 100: '#eceef2', 200: '#d5d9e0', 300: '#b1b8c4', 400: '#8791a2',
  500: '#667085', 600: '#4f5869', 700: '#3d4452', 800: '#272c36', 900: '#161a21',
} as const

export const primary = {
  50: '#eef8f8', 100: '#d3eeee', 200: '#a7dcdc', 300: '#6fc1c2', 400: '#3a9fa2',
  500: '#1f8286', 600: '#146a6e', 700: '#0f5e63', 800: '#0c4a4e', 900: '#083538',
} as const

export const caution = { 50: '#fff8e6', 100: '#fdebbf', 500: '#d08a12', 700: '#8a5a06', 900: '#4d3203' } as const

export const danger = { 50: '#fdf0f2', 100: '#f9d4da', 500: '#c42848', 700: '#9b1733', 900: '#5c0a1c' } as const

/**
 * Sequential risk ramp, dark blue (low) to yellow (high). The stops follow the cividis colour map
 * (Nuñez, Anderton & Renslow 2018, PLOS ONE 13(7): e0199239), designed so that readers with
 * colour-vision deficiency perceive the same ordering. Used by maps, heatmaps and tables alike.
 */
export const riskRamp = [
  '#00224e', '#123570', '#3b496c', '#575d6d', '#707173',
  '#8a8678', '#a59c74', '#c3b369', '#e1cc55', '#fee838',
] as const

/** Text colour that stays readable on a given ramp stop. */
export function riskRampTextColour(index: number): string {
  return index < 6 ? '#ffffff' : ink[900]
}

/** Colour for a value in [0, 1] on the risk ramp (clamped); interpolates between stops. */
export function riskColour(t: number): string {
  const x = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0)) * (riskRamp.length - 1)
  const i = Math.min(riskRamp.length - 2, Math.floor(x))
  return mixHex(riskRamp[i]!, riskRamp[i + 1]!, x - i)
}

function mixHex(a: string, b: string, t: number): string {
  const pa = parseInt(a.slice(1), 16)
  const pb = parseInt(b.slice(1), 16)
  const channel = (shift: number) => {
    const ca = (pa >> shift) & 255
    const cb = (pb >> shift) & 255
    return Math.round(ca + (cb - ca) * t)
  }
  return '#' + [16, 8, 0].map(s => channel(s).toString(16).padStart(2, '0')).join('')
}

/** Series colours for charts that compare categories (not risk): distinguishable, not a ramp. */
export const seriesColours = [primary[700], caution[500], '#5b4b9a', ink[600], primary[400], '#7a8f2a'] as const
