// The map's declutter, scale bar and the basemap's line simplification.
import { describe, expect, it } from 'vitest'
import { clusterPoints, KM_PER_DEG_EQUATOR, scaleBar } from '../../shared/results/map'
import { simplifyLine } from '../../shared/results/simplify'

describe('clusterPoints', () => {
  const pts = [
    { id: 'a', latitude: 32, longitude: -102, w: 5 },
    { id: 'b', latitude: 32.001, longitude: -102.001, w: 1 },
    { id: 'c', latitude: 33, longitude: -101, w: 3 },
  ]
  it('groups points closer on screen than the radius, and no others', () => {
    // 100 px per degree: a and b lie 0.14 px apart, c 141 px from a (hand-worked: √(100² + 100²)).
    const c = clusterPoints(pts, p => p.w, 100, 100, 18)
    expect(c.map(g => g.members.map(m => m.id).sort())).toEqual([['a', 'b'], ['c']])
    // The group sits at the mean of its members (closed form).
    expect(c[0]!.position[0]).toBeCloseTo(-102.0005, 10)
    expect(c[0]!.position[1]).toBeCloseTo(32.0005, 10)
  })
  it('keeps every point alone once zoomed in far enough', () => {
    // 1e5 px per degree: a and b are 141 px apart (hand-worked).
    expect(clusterPoints(pts, p => p.w, 1e5, 1e5, 18).every(g => g.members.length === 1)).toBe(true)
  })
  it('draws 180 sites spread over a basin as many marks, not one', () => {
    // A 13 × 14 lattice over 2.6° × 1.7° (the demo's span, server/db/seed/inventory.ts) at 300 px per degree:
    // neighbours 0.2° × 0.13° apart are 60 × 39 px apart, beyond an 18 px radius, so none merge (hand-worked).
    const lattice = Array.from({ length: 180 }, (_, k) => ({ latitude: 31.2 + (k % 13) * 0.13, longitude: -103.9 + Math.floor(k / 13) * 0.2 }))
    expect(clusterPoints(lattice, () => 1, 300, 300, 18).length).toBe(180)
    // At 5 px per degree the whole basin is 13 × 8.5 px: one group (hand-worked).
    expect(clusterPoints(lattice, () => 1, 5, 5, 18).length).toBe(1)
  })
})

describe('scaleBar', () => {
  it('picks the longest 1-2-5 length that fits', () => {
    // At the equator 1° of longitude is 2π·6371.0088/360 = 111.195 km (mean Earth radius, IUGG).
    expect(KM_PER_DEG_EQUATOR).toBeCloseTo(111.195, 3)
    // 10 px per degree: 11.12 km per px, 110 px = 1,223 km → 1,000 km over 89.9 px (hand-worked).
    const s = scaleBar(10, 0, 110)!
    expect(s.km).toBe(1000)
    expect(s.px).toBeCloseTo(1000 / 11.1195, 2)
    expect(s.label).toBe('1,000 km')
  })
  it('shortens with latitude (cos φ) and writes metres below a kilometre', () => {
    // At 60° a degree of longitude is half as long (cos 60° = 0.5): 5.56 km per px at 10 px/° → 500 km fits (611 km max).
    expect(scaleBar(10, 60, 110)!.km).toBe(500)
    // 100,000 px per degree at the equator: 1.112 m per px, 110 px = 122 m → 100 m (hand-worked).
    expect(scaleBar(1e5, 0, 110)!.label).toBe('100 m')
  })
})

describe('simplifyLine (Douglas & Peucker 1973)', () => {
  it('drops points nearer the chord than the tolerance and keeps the ends and the far ones', () => {
    // A wiggle of ±0.02 around the chord goes at tolerance 0.1 (hand-worked).
    const wiggle: [number, number][] = [[0, 0], [1, 0.01], [2, -0.01], [3, 0.02], [4, 0]]
    expect(simplifyLine(wiggle, 0.1)).toEqual([[0, 0], [4, 0]])
    expect(simplifyLine(wiggle, 0)).toHaveLength(5)
    // A peak: (4, 1) lies 1 from the chord (0,0)–(8,0), kept; (2, 0.01) lies |2/4 − 0.01|·4/√17 = 0.475
    // from the chord (0,0)–(4,1), under 0.5, dropped, and (6, 0.01) likewise (hand-worked).
    expect(simplifyLine([[0, 0], [2, 0.01], [4, 1], [6, 0.01], [8, 0]], 0.5)).toEqual([[0, 0], [4, 1], [8, 0]])
    expect(simplifyLine([[0, 0], [2, 0.01], [4, 1], [6, 0.01], [8, 0]], 0.45)).toHaveLength(5)
    expect(simplifyLine([[0, 0], [1, 1]], 10)).toEqual([[0, 0], [1, 1]])
  })
})
