// Where a flash attaches: closed forms of the electrogeometric model (MODEL.md §2) and the
// IEC 62305-2 collection areas. The site-wide capture search itself lives in kernel.ts, on
// precomputed typed arrays.
import type { AttachmentModel } from './types'

export interface StrikingDistanceParams { strikingDistanceA: number; strikingDistanceB: number; groundStrikingFactor: number }

/** Striking distance rs = A·I^b in metres (A = 10, b = 0.65: the form behind the IEC 62305-1 rolling-sphere radii). */
export function strikingDistance(currentKa: number, a: number, b: number): number {
  return a * Math.pow(currentKa, b)
}

/**
 * Lateral attraction distance of an isolated vertical cylinder (axis to the furthest captured
 * leader): D(I) = a + sqrt(rs² − (rg − H)²) for H < rg, a + rs otherwise; 0 when the ground
 * always wins (only possible with kg > 1).
 */
export function lateralAttractionDistance(currentKa: number, heightM: number, radiusM: number, p: StrikingDistanceParams): number {
  const rs = strikingDistance(currentKa, p.strikingDistanceA, p.strikingDistanceB)
  const rg = p.groundStrikingFactor * rs
  if (heightM >= rg) return radiusM + rs
  const gap = rg - heightM
  if (gap >= rs) return 0
  return radiusM + Math.sqrt(rs * rs - gap * gap)
}

/**
 * Horizontal distance from the axis within which a vertical leader attaches to an isolated object,
 * under the chosen attachment rule: the EGM lateral attraction distance, or the IEC 62305-2 rule
 * (within 3H of the edge, independent of current).
 */
export function isolatedCaptureRadius(model: AttachmentModel, currentKa: number, heightM: number, radiusM: number, p: StrikingDistanceParams): number {
  return model === 'collection_area'
    ? radiusM + 3 * heightM
    : lateralAttractionDistance(currentKa, heightM, radiusM, p)
}

/** IEC 62305-2 collection area of an isolated rectangular structure L × W × H: L·W + 2·3H·(L+W) + π(3H)². */
export function collectionAreaRectangular(lengthM: number, widthM: number, heightM: number): number {
  const reach = 3 * heightM
  return lengthM * widthM + 2 * reach * (lengthM + widthM) + Math.PI * reach * reach
}

/** The same rule for a vertical cylinder of radius a (a tank, a mast): π(a + 3H)². */
export function collectionAreaCylinder(radiusM: number, heightM: number): number {
  const r = radiusM + 3 * heightM
  return Math.PI * r * r
}

/** IEEE Std 1410's inner edge of the band of indirect (nearby) flashes for a line of height h: sqrt(rs² − (rg − h)²). */
export function indirectFlashMinimumDistance(currentKa: number, heightM: number, p: StrikingDistanceParams): number {
  return lateralAttractionDistance(currentKa, heightM, 0, p)
}
