// Douglas–Peucker line simplification (Douglas & Peucker 1973): keeps the end points and every point
// farther than `tolerance` from the chord of the part it lies in. Used to make the shipped basemap small.

type Point = [number, number]

function distanceToSegment(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0]
  const dy = b[1] - a[1]
  const len2 = dx * dx + dy * dy
  if (len2 === 0) return Math.hypot(p[0] - a[0], p[1] - a[1])
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2))
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy))
}

/** The simplified line; lines of two points or fewer come back unchanged. */
export function simplifyLine(points: readonly Point[], tolerance: number): Point[] {
  if (points.length <= 2) return points.map(p => [p[0], p[1]])
  const keep = new Uint8Array(points.length)
  keep[0] = 1
  keep[points.length - 1] = 1
  const stack: [number, number][] = [[0, points.length - 1]]
  while (stack.length) {
    const [from, to] = stack.pop()!
    let worst = -1
    let at = -1
    for (let k = from + 1; k < to; k++) {
      const d = distanceToSegment(points[k]!, points[from]!, points[to]!)
      if (d > worst) { worst = d; at = k }
    }
    if (at > 0 && worst > tolerance) {
      keep[at] = 1
      stack.push([from, at], [at, to])
    }
  }
  return points.filter((_, k) => keep[k]).map(p => [p[0], p[1]])
}
