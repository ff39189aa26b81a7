// Dotted paths into nested objects ("thresholds.sharp_device.u50Kv"), as the assumption metadata uses.

export function getPath(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), obj)
}

/** A nested object holding `value` at `path` (merged into `into` when given). */
export function setPath(into: Record<string, unknown>, path: string, value: unknown): Record<string, unknown> {
  const keys = path.split('.')
  let o = into
  for (const k of keys.slice(0, -1)) {
    if (!o[k] || typeof o[k] !== 'object') o[k] = {}
    o = o[k] as Record<string, unknown>
  }
  o[keys.at(-1)!] = value
  return into
}
