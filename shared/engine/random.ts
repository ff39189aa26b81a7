// Seeded random streams. Each (run, site, purpose) gets its own stream whose seed is derived from
// the run seed and the site's id, so a site's result never depends on which other sites share its
// batch, on their order, or on how many workers split the run (MODEL.md §5).
import seedrandom from 'seedrandom'

/** A uniform generator on the open interval (0, 1). */
export type UniformStream = () => number

/** The seed text of one stream; stable across releases because results are reproduced from it. */
export function streamSeed(runSeed: number | string, siteId: string, purpose: string): string {
  return `stormledger|${runSeed}|${siteId}|${purpose}`
}

/**
 * A stream on Baagøe's Alea generator, seeded by seedrandom's `alea` (its Mash hashing of the seed
 * text) and then stepped here with the same recurrence, so the sequence is seedrandom's `alea`
 * sequence while the hot loops call a small closure V8 can inline.
 * Alea returns multiples of 2⁻³², including 0; shifting by half a step keeps every draw strictly
 * inside (0, 1) so inversion sampling never meets log(0) or an infinite quantile.
 */
export function createStream(runSeed: number | string, siteId: string, purpose: string): UniformStream {
  const seeded = seedrandom.alea(streamSeed(runSeed, siteId, purpose), { state: true })
  const generator = new AleaState(seeded.state())
  return () => generator.next()
}

/** Alea's state in object fields (unboxed doubles in V8, unlike mutable closure variables). */
class AleaState {
  private s0: number
  private s1: number
  private s2: number
  private c: number
  constructor(state: { s0: number; s1: number; s2: number; c: number }) {
    this.s0 = state.s0
    this.s1 = state.s1
    this.s2 = state.s2
    this.c = state.c
  }

  next(): number {
    const t = 2091639 * this.s0 + this.c * 2.3283064365386963e-10 // 2⁻³²
    this.s0 = this.s1
    this.s1 = this.s2
    this.c = t | 0
    this.s2 = t - this.c
    return this.s2 + 1.1641532182693481e-10 // 2⁻³³
  }
}

/** Poisson count by inversion for small means and by a sum of smaller Poisson draws for large ones. */
export function poissonDraw(mean: number, uniform: UniformStream): number {
  let remaining = mean
  let count = 0
  // Splitting keeps exp(-mean) far from underflow; the sum of independent Poissons is Poisson.
  while (remaining > 30) {
    count += poissonInversion(30, uniform)
    remaining -= 30
  }
  return count + poissonInversion(remaining, uniform)
}

function poissonInversion(mean: number, uniform: UniformStream): number {
  if (mean <= 0) return 0
  const u = uniform()
  let k = 0
  let p = Math.exp(-mean)
  let cumulative = p
  while (u > cumulative && k < 1000) {
    k += 1
    p *= mean / k
    cumulative += p
  }
  return k
}
