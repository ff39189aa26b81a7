// Accumulation (issue 21 point 3; docs/methodology.md "Accumulation view"): which sites lose together in
// the portfolio's worst simulated years. From the ground-up loss events of a simulated-years run:
// the portfolio's year losses (sites add year by year, the same index being the same simulated year),
// its worst years (those at or beyond the loss at the chosen return period, k = ⌊Y/T⌋ of Y years),
// each site's share of the loss in those years and how often it loses in them, and groups of sites
// that co-lose: sites are joined when they lose together in at least `minShareTogether` of the worst
// years in which either loses (the Jaccard index of their worst-year sets; Jaccard 1901) and in at
// least two of them; a group is a connected set of joined sites (union–find).

export interface AccumulationSiteEvents {
  siteId: string
  /** Simulated year (0 … years − 1) of each loss event, and its ground-up loss. */
  year: ArrayLike<number>
  loss: ArrayLike<number>
}

export interface AccumulationOptions {
  /** Worst years are the ⌊years / T⌋ largest portfolio year losses (at least one). */
  returnPeriodYears: number
  /** Jaccard index of two sites' worst-year sets at or above which they are joined. */
  minShareTogether: number
}

export const ACCUMULATION_DEFAULTS: AccumulationOptions = { returnPeriodYears: 100, minShareTogether: 0.5 }

export interface AccumulationSite {
  siteId: string
  /** Ground-up loss in the worst years (summed over them), and its share of the portfolio's. */
  worstYearsLoss: number
  share: number
  /** Worst years in which the site loses (count and share of the worst years). */
  lossYears: number
  lossYearShare: number
  /** Index into `groups`, or null when the site co-loses with none. */
  group: number | null
}

export interface AccumulationGroup {
  siteIds: string[]
  worstYearsLoss: number
  share: number
  /** Worst years in which every member loses, and in which at least two members lose (count). */
  allTogetherYears: number
  twoOrMoreYears: number
}

export interface Accumulation {
  years: number
  returnPeriodYears: number
  /** The worst years, largest portfolio loss first (earlier year first on ties). */
  worstYears: { year: number, loss: number }[]
  /** The smallest of the worst years' losses: the portfolio's loss at the return period (empirical). */
  thresholdLoss: number
  worstYearsLoss: number
  minShareTogether: number
  sites: AccumulationSite[]
  groups: AccumulationGroup[]
}

function popcount(x: number): number {
  x -= (x >>> 1) & 0x55555555
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333)
  return (((x + (x >>> 4)) & 0x0F0F0F0F) * 0x01010101) >>> 24
}

export function accumulation(years: number, sites: readonly AccumulationSiteEvents[], options: AccumulationOptions = ACCUMULATION_DEFAULTS): Accumulation {
  const portfolio = new Float64Array(years)
  for (const s of sites) for (let e = 0; e < s.year.length; e++) portfolio[s.year[e]!]! += s.loss[e]!
  const k = years > 0 ? Math.max(1, Math.floor(years / options.returnPeriodYears)) : 0
  // The k largest year losses, only years with a loss (a run with fewer loss years has fewer worst years).
  const lossYears: number[] = []
  for (let y = 0; y < years; y++) if (portfolio[y]! > 0) lossYears.push(y)
  lossYears.sort((a, b) => portfolio[b]! - portfolio[a]! || a - b)
  const worst = lossYears.slice(0, k)
  const worstYearsLoss = worst.reduce((a, y) => a + portfolio[y]!, 0)
  const rank = new Int32Array(years).fill(-1)
  worst.forEach((y, i) => { rank[y] = i })

  const words = Math.ceil(worst.length / 32)
  const sets: Uint32Array[] = []
  const rows: AccumulationSite[] = sites.map((s) => {
    const set = new Uint32Array(words)
    const yearLoss = new Map<number, number>()
    for (let e = 0; e < s.year.length; e++) {
      const r = rank[s.year[e]!]!
      if (r < 0 || !(s.loss[e]! > 0)) continue
      set[r >>> 5]! |= 1 << (r & 31)
      yearLoss.set(r, (yearLoss.get(r) ?? 0) + s.loss[e]!)
    }
    sets.push(set)
    let loss = 0
    for (const v of yearLoss.values()) loss += v
    return { siteId: s.siteId, worstYearsLoss: loss, share: worstYearsLoss > 0 ? loss / worstYearsLoss : 0, lossYears: yearLoss.size, lossYearShare: worst.length ? yearLoss.size / worst.length : 0, group: null }
  })

  // Join co-losing sites (only sites that lose in two or more worst years can be joined).
  const parent = rows.map((_, i) => i)
  const find = (i: number): number => { while (parent[i] !== i) { parent[i] = parent[parent[i]!]!; i = parent[i]! } return i }
  const candidates = rows.map((r, i) => (r.lossYears >= 2 || (worst.length === 1 && r.lossYears === 1) ? i : -1)).filter(i => i >= 0)
  const minTogether = Math.min(2, worst.length)
  for (let a = 0; a < candidates.length; a++) {
    const i = candidates[a]!, si = sets[i]!
    for (let b = a + 1; b < candidates.length; b++) {
      const j = candidates[b]!, sj = sets[j]!
      let both = 0
      for (let w = 0; w < words; w++) both += popcount(si[w]! & sj[w]!)
      if (both < minTogether) continue
      const either = rows[i]!.lossYears + rows[j]!.lossYears - both
      if (both / either >= options.minShareTogether) parent[find(i)] = find(j)
    }
  }
  const members = new Map<number, number[]>()
  for (const i of candidates) {
    const root = find(i)
    const list = members.get(root)
    if (list) list.push(i)
    else members.set(root, [i])
  }
  const groups: AccumulationGroup[] = []
  const groupSets = [...members.values()].filter(m => m.length >= 2)
  const counts = new Uint16Array(worst.length)
  for (const m of groupSets) {
    counts.fill(0)
    for (const i of m) for (let r = 0; r < worst.length; r++) if ((sets[i]![r >>> 5]! >>> (r & 31)) & 1) counts[r]!++
    let all = 0, two = 0
    for (let r = 0; r < worst.length; r++) { if (counts[r] === m.length) all++; if (counts[r]! >= 2) two++ }
    const loss = m.reduce((a, i) => a + rows[i]!.worstYearsLoss, 0)
    groups.push({ siteIds: m.map(i => rows[i]!.siteId), worstYearsLoss: loss, share: worstYearsLoss > 0 ? loss / worstYearsLoss : 0, allTogetherYears: all, twoOrMoreYears: two })
  }
  groups.sort((a, b) => b.worstYearsLoss - a.worstYearsLoss || (a.siteIds[0]! < b.siteIds[0]! ? -1 : 1))
  const groupOf = new Map<string, number>()
  groups.forEach((g, gi) => g.siteIds.forEach(id => groupOf.set(id, gi)))
  for (const r of rows) r.group = groupOf.get(r.siteId) ?? null

  return {
    years, returnPeriodYears: options.returnPeriodYears,
    worstYears: worst.map(y => ({ year: y, loss: portfolio[y]! })),
    thresholdLoss: worst.length ? portfolio[worst.at(-1)!]! : 0,
    worstYearsLoss, minShareTogether: options.minShareTogether,
    sites: rows, groups,
  }
}
