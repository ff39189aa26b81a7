// Number and unit formatting used by every screen and export: one way to write a figure.

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
}

const toSuperscript = (n: number) => String(n).split('').map(c => SUPERSCRIPT[c] ?? c).join('')

/** Round to `digits` significant figures (0 stays 0). */
export function roundSignificant(value: number, digits = 2): number {
  if (value === 0 || !Number.isFinite(value)) return value
  const magnitude = Math.floor(Math.log10(Math.abs(value)))
  const factor = 10 ** (digits - 1 - magnitude)
  return Math.round(value * factor) / factor
}

/**
 * A number for reading: plain between 0.01 and 100 000, otherwise "1.2 × 10⁻³".
 * `digits` are significant figures.
 */
export function formatNumber(value: number | null | undefined, digits = 2): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '—'
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞'
  if (value === 0) return '0'
  const abs = Math.abs(value)
  if (abs >= 0.01 && abs < 100_000) {
    const rounded = roundSignificant(value, digits)
    const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)))
    return rounded.toLocaleString('en-GB', { minimumFractionDigits: Math.min(decimals, 6), maximumFractionDigits: Math.min(decimals, 6) })
  }
  const exponent = Math.floor(Math.log10(abs))
  let mantissa = roundSignificant(value / 10 ** exponent, digits)
  let exp = exponent
  if (Math.abs(mantissa) >= 10) { mantissa /= 10; exp += 1 }
  return `${mantissa.toFixed(digits - 1)} × 10${toSuperscript(exp)}`
}

/** An annual frequency: "1.2 × 10⁻³ /yr". */
export function formatFrequency(perYear: number | null | undefined, digits = 2): string {
  if (perYear === null || perYear === undefined || Number.isNaN(perYear)) return '—'
  return `${formatNumber(perYear, digits)} /yr`
}

/** The return period of an annual frequency: "once in 830 years" (two significant figures). */
export function formatOnceIn(perYear: number | null | undefined): string {
  if (perYear === null || perYear === undefined || Number.isNaN(perYear)) return '—'
  if (perYear <= 0) return 'never in the simulation'
  const years = 1 / perYear
  if (years < 1) return `${formatNumber(perYear, 2)} times a year`
  const rounded = roundSignificant(years, 2)
  return `once in ${rounded.toLocaleString('en-GB')} year${rounded === 1 ? '' : 's'}`
}

/** Most significant figures an interval is ever printed with; past it the printer writes value ± half-width. */
const MAX_INTERVAL_DIGITS = 10

/**
 * Significant figures (at least `digits`) with which `write` prints `low` and `high` differently
 * whenever they differ; null when even MAX_INTERVAL_DIGITS cannot tell them apart.
 */
export function intervalDigits(low: number, high: number, digits = 2, write: (v: number, d: number) => string = formatNumber): number | null {
  if (low === high) return digits
  for (let d = digits; d <= MAX_INTERVAL_DIGITS; d++) if (write(low, d) !== write(high, d)) return d
  return null
}

/**
 * "lo–hi" with enough significant figures that the two ends differ whenever they differ (never
 * "14–14"); when not even ten figures separate them, "value ± half-width".
 */
export function formatRange(low: number, high: number, digits = 2, write: (v: number, d: number) => string = formatNumber, value = (low + high) / 2): string {
  const d = intervalDigits(low, high, digits, write)
  if (d === null) return `${write(value, digits)} ± ${formatNumber((high - low) / 2, 2)}`
  return `${write(low, d)}–${write(high, d)}`
}

/** A value with its interval: "0.012 /yr (0.010–0.014)"; ends that share leading digits get more digits: "14 /yr (13.6–14.4)". */
export function formatInterval(value: number, low: number, high: number, unit = '', digits = 2): string {
  const u = unit ? ` ${unit}` : ''
  const d = intervalDigits(low, high, digits) ?? digits
  return `${formatNumber(value, d)}${u} (${formatRange(low, high, digits, formatNumber, value)})`
}

/** A figure known only by an upper bound (stopped by the negligible-rate rule): "≤ 3.1 × 10⁻⁶ /yr". */
export function formatUpperBound(high: number, unit = '', digits = 2): string {
  return `≤ ${formatNumber(high, digits)}${unit ? ` ${unit}` : ''}`
}

/** A figure with an interval, or with its upper bound alone when `upperBoundOnly`. */
export function formatEstimate(e: { rate: number, lo: number, hi: number, upperBoundOnly?: boolean }, unit = '', digits = 2): string {
  return e.upperBoundOnly ? `${formatUpperBound(e.hi, unit, digits)} (negligible)` : formatInterval(e.rate, e.lo, e.hi, unit, digits)
}

/**
 * An amount of money without the currency, whole units with thousands separators; `digits` > 0
 * adds that many decimals (for intervals whose ends share every whole unit).
 */
export function formatAmount(amount: number, decimals = 0): string {
  if (Math.abs(amount) < 1 && amount !== 0 && decimals === 0) return formatNumber(amount, 2)
  return amount.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })
}

/** A money interval: "USD 12,000–15,500"; more decimals when the whole units collapse, then value ± half-width. */
export function formatMoneyRange(low: number, high: number, currency = 'USD'): string {
  if (low === high) return `${currency} ${formatAmount(low)}`
  for (let decimals = 0; decimals <= 4; decimals++) {
    if (formatAmount(low, decimals) !== formatAmount(high, decimals)) return `${currency} ${formatAmount(low, decimals)}–${formatAmount(high, decimals)}`
  }
  return `${currency} ${formatAmount((low + high) / 2, 2)} ± ${formatNumber((high - low) / 2, 2)}`
}

export const formatCurrent = (kA: number | null | undefined) => (kA === null || kA === undefined ? '—' : `${formatNumber(kA, 3)} kA`)
export const formatPotential = (kV: number | null | undefined) => (kV === null || kV === undefined ? '—' : `${formatNumber(kV, 3)} kV`)
export const formatLength = (m: number | null | undefined) => (m === null || m === undefined ? '—' : `${formatNumber(m, 3)} m`)
export const formatFlashDensity = (ng: number | null | undefined) => (ng === null || ng === undefined ? '—' : `${formatNumber(ng, 3)} flashes/km²/yr`)

/** Money in the organisation's currency with thousands separators: "USD 1,250,000". */
export function formatMoney(amount: number | null | undefined, currency = 'USD', fractionDigits = 0): string {
  if (amount === null || amount === undefined || Number.isNaN(amount)) return '—'
  const n = amount.toLocaleString('en-GB', { minimumFractionDigits: fractionDigits, maximumFractionDigits: fractionDigits })
  return `${currency} ${n}`
}

/** A share as a percentage: 0.1234 → "12.3 %". */
export function formatShare(share: number | null | undefined, digits = 3): string {
  if (share === null || share === undefined || Number.isNaN(share)) return '—'
  return `${formatNumber(share * 100, digits)} %`
}

/**
 * A probability (of an event in a storm, of a fire): "12.3 %" from 0.1 %, smaller ones with two
 * significant digits ("0.0032 %"), "0 %" for none — never an exponent.
 */
export function formatProbability(p: number | null | undefined): string {
  if (p === null || p === undefined || Number.isNaN(p)) return '—'
  if (p <= 0) return '0 %'
  if (p >= 0.001) return `${(100 * p).toFixed(1)} %`
  const percent = 100 * p
  if (percent < 1e-9) return '< 0.000000001 %'
  return `${percent.toFixed(1 - Math.floor(Math.log10(percent)))} %`
}

/** A position in decimal degrees with its hemisphere: 32.05, −102.7 → "32.0500° N, 102.7000° W" (WGS 84). */
export function formatCoordinates(latitudeDeg: number, longitudeDeg: number): string {
  return `${Math.abs(latitudeDeg).toFixed(4)}° ${latitudeDeg >= 0 ? 'N' : 'S'}, ${Math.abs(longitudeDeg).toFixed(4)}° ${longitudeDeg >= 0 ? 'E' : 'W'}`
}

/** A whole count with thousands separators: 12345 → "12,345". */
export function formatCount(count: number | null | undefined): string {
  if (count === null || count === undefined || Number.isNaN(count)) return '—'
  return Math.round(count).toLocaleString('en-GB')
}

/**
 * Money for chart axes and tiles, shortened: "USD 15 M", "USD 850 k", "USD 1.2 bn" (never "1.5 × 10⁷").
 * Amounts under a thousand are written out.
 */
export function formatMoneyShort(amount: number | null | undefined, currency = 'USD'): string {
  if (amount === null || amount === undefined || Number.isNaN(amount)) return '—'
  const abs = Math.abs(amount)
  const steps: Array<[number, string]> = [[1e9, 'bn'], [1e6, 'M'], [1e3, 'k']]
  for (const [size, suffix] of steps) {
    if (abs >= size) return `${currency} ${roundSignificant(amount / size, 3).toLocaleString('en-GB')} ${suffix}`
  }
  return `${currency} ${roundSignificant(amount, 3).toLocaleString('en-GB')}`
}

// Dates and times: one format, in UTC, so the server and the browser render the same text (no
// hydration mismatch) and readers in different places read the same moment.

/** "2026-03-14 09:05 UTC". */
export function formatDateTime(value: string | Date | null | undefined): string {
  if (!value) return '—'
  const d = typeof value === 'string' ? new Date(value) : value
  if (Number.isNaN(d.getTime())) return '—'
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`
}

/** "2026-03-14" (the UTC date). */
export function formatDate(value: string | Date | null | undefined): string {
  if (!value) return '—'
  const d = typeof value === 'string' ? new Date(value) : value
  return Number.isNaN(d.getTime()) ? '—' : d.toISOString().slice(0, 10)
}

/** 75 → "1 min 15 s"; 3 → "3 s"; 4000 → "1 h 6 min". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—'
  const s = Math.round(seconds)
  if (s < 60) return `${s} s`
  const m = Math.floor(s / 60)
  if (m < 60) return `${m} min${s % 60 ? ` ${s % 60} s` : ''}`
  return `${Math.floor(m / 60)} h${m % 60 ? ` ${m % 60} min` : ''}`
}
