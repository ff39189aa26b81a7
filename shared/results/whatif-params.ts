// The single-tank what-if: its parameters, their ranges and defaults, reading them from a URL query,
// and what changed against a baseline. Pure: no engine, no Vue.
import { z } from 'zod'

export type WhatIfCurrentLaw = 'power_law' | 'lognormal'

export interface WhatIfParams {
  /** Ground flash density Ng, flashes/km²/yr. */
  flashDensity: number
  tankHeightM: number
  tankDiameterM: number
  /** 50 % sparking level of the tank's internal parts, kV. */
  u50Kv: number
  /** Log-normal scatter σ of the sparking level (0 = sharp threshold). */
  sigma: number
  /** Induced-sparking shield rating, kA; 0 = no shield. */
  shieldKa: number
  /** Height of a nearby mast, m; 0 = no mast. */
  mastHeightM: number
  /** Distance from the tank's axis to the mast, m. */
  mastDistanceM: number
  currentLaw: WhatIfCurrentLaw
}

export interface ParamSpec {
  key: Exclude<keyof WhatIfParams, 'currentLaw'>
  label: string
  unit: string
  min: number
  max: number
  step: number
  /** Query-string name. */
  query: string
  help: string
}

/**
 * Defaults: a 7.3 m (24 ft) high, 4.6 m (15 ft) wide fibreglass tank — a common production-site
 * size — with sharp-edged devices at MODEL.md §4's illustrative 70 kV and σ 0.3, Ng = 4 (from memory:
 * a moderately active region), no shield, no mast.
 */
export const defaultWhatIfParams: Readonly<WhatIfParams> = Object.freeze({
  flashDensity: 4,
  tankHeightM: 7.3,
  tankDiameterM: 4.6,
  u50Kv: 70,
  sigma: 0.3,
  shieldKa: 0,
  mastHeightM: 0,
  mastDistanceM: 15,
  currentLaw: 'power_law',
})

export const paramSpecs: readonly ParamSpec[] = [
  { key: 'flashDensity', label: 'Ground flash density', unit: 'flashes/km²/yr', min: 0.1, max: 30, step: 0.1, query: 'ng', help: 'Flashes to ground per km² per year at the site.' },
  { key: 'tankHeightM', label: 'Tank height', unit: 'm', min: 1, max: 20, step: 0.1, query: 'height', help: 'Also the height of the internal parts.' },
  { key: 'tankDiameterM', label: 'Tank diameter', unit: 'm', min: 1, max: 20, step: 0.1, query: 'diameter', help: '' },
  { key: 'u50Kv', label: '50 % sparking level U50', unit: 'kV', min: 10, max: 400, step: 1, query: 'u50', help: 'Of the most easily sparking internal part.' },
  { key: 'sigma', label: 'Sparking scatter, log-normal σ', unit: 'dimensionless', min: 0, max: 1, step: 0.01, query: 'sigma', help: '0 is a sharp threshold.' },
  { key: 'shieldKa', label: 'Induced-sparking shield rating', unit: 'kA', min: 0, max: 200, step: 1, query: 'shield', help: '0 is no shield; no sparking for currents up to the rating.' },
  { key: 'mastHeightM', label: 'Nearby mast height', unit: 'm', min: 0, max: 60, step: 0.5, query: 'mast', help: '0 is no mast.' },
  { key: 'mastDistanceM', label: 'Distance to the mast', unit: 'm', min: 3, max: 200, step: 1, query: 'mastdist', help: 'From the tank’s axis.' },
]

export const currentLawLabels: Record<WhatIfCurrentLaw, string> = {
  power_law: 'Power law (IEEE Std 1410)',
  lognormal: 'Log-normal (CIGRE)',
}

const numberIn = (s: ParamSpec) => z.coerce.number().min(s.min).max(s.max)

/**
 * Parameters from a URL query (e.g. ?ng=6&height=9); absent or invalid values fall back to the
 * defaults (or the given base), and each rejected value is reported.
 */
export function paramsFromQuery(query: Record<string, unknown>, base: WhatIfParams = defaultWhatIfParams): { params: WhatIfParams, rejected: string[] } {
  const params: WhatIfParams = { ...base }
  const rejected: string[] = []
  for (const s of paramSpecs) {
    const raw = first(query[s.query])
    if (raw === undefined || raw === '') continue
    const parsed = numberIn(s).safeParse(raw)
    if (parsed.success) params[s.key] = parsed.data
    else rejected.push(`${s.label}: "${raw}" is not between ${s.min} and ${s.max} ${s.unit}`)
  }
  const law = first(query.law)
  if (law === 'power_law' || law === 'lognormal') params.currentLaw = law
  else if (law !== undefined && law !== '') rejected.push(`Current law: "${law}" is not one of ${Object.keys(currentLawLabels).join(', ')}`)
  return { params, rejected }
}

function first(v: unknown): string | undefined {
  if (Array.isArray(v)) return first(v[0])
  return typeof v === 'string' ? v : typeof v === 'number' ? String(v) : undefined
}

/** The query string that reproduces these parameters (only values that differ from the defaults). */
export function queryFromParams(p: WhatIfParams): Record<string, string> {
  const q: Record<string, string> = {}
  for (const s of paramSpecs) if (p[s.key] !== defaultWhatIfParams[s.key]) q[s.query] = String(p[s.key])
  if (p.currentLaw !== defaultWhatIfParams.currentLaw) q.law = p.currentLaw
  return q
}

export interface ParamChange { key: keyof WhatIfParams, label: string, from: number | string, to: number | string, unit: string }

/** The parameters that differ from the baseline, in form order. */
export function changedParams(p: WhatIfParams, baseline: WhatIfParams): ParamChange[] {
  const out: ParamChange[] = paramSpecs
    .filter(s => p[s.key] !== baseline[s.key])
    .map(s => ({ key: s.key, label: s.label, from: baseline[s.key], to: p[s.key], unit: s.unit }))
  if (p.currentLaw !== baseline.currentLaw) out.push({ key: 'currentLaw', label: 'Current law', from: currentLawLabels[baseline.currentLaw], to: currentLawLabels[p.currentLaw], unit: '' })
  return out
}
