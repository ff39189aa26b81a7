// The audit log's before/after as readable lines, "field: old → new", instead of JSON. Nested
// records are flattened to dotted field names; an update lists only the fields that changed; a
// record created or deleted lists its fields with their one value. Pure.

export interface ChangeLine {
  field: string
  /** Absent: the field did not exist before (created). */
  before?: string
  /** Absent: the field does not exist after (deleted). */
  after?: string
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

/** One value in words: text as it is, yes/no, "—" for none, lists joined, anything else compact. */
export function auditValue(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—'
  if (typeof v === 'boolean') return v ? 'yes' : 'no'
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '—'
  if (typeof v === 'string') return v
  if (Array.isArray(v)) return v.length === 0 ? '(none)' : v.map(x => (isRecord(x) || Array.isArray(x) ? JSON.stringify(x) : auditValue(x))).join(', ')
  return JSON.stringify(v)
}

function flatten(v: unknown, prefix: string, out: Map<string, unknown>) {
  if (isRecord(v) && Object.keys(v).length > 0) {
    for (const [k, x] of Object.entries(v)) flatten(x, prefix ? `${prefix}.${k}` : k, out)
  }
  else {
    out.set(prefix, v)
  }
}

/** The lines for one audit event. A value that is not a record is shown as the field "value". */
export function auditChangeLines(before: unknown, after: unknown): ChangeLine[] {
  const b = new Map<string, unknown>()
  const a = new Map<string, unknown>()
  if (before !== null && before !== undefined) flatten(before, '', b)
  if (after !== null && after !== undefined) flatten(after, '', a)
  const fields = [...new Set([...b.keys(), ...a.keys()])]
  const lines: ChangeLine[] = []
  for (const key of fields) {
    const field = key || 'value'
    const hasBefore = b.has(key)
    const hasAfter = a.has(key)
    if (hasBefore && hasAfter) {
      const from = auditValue(b.get(key))
      const to = auditValue(a.get(key))
      if (from !== to) lines.push({ field, before: from, after: to })
    }
    else if (hasAfter) {
      lines.push({ field, after: auditValue(a.get(key)) })
    }
    else {
      lines.push({ field, before: auditValue(b.get(key)) })
    }
  }
  return lines
}

/** "field: old → new", "field: new" (created) or "field: old (removed)". */
export function formatChangeLine(l: ChangeLine): string {
  if (l.before !== undefined && l.after !== undefined) return `${l.field}: ${l.before} → ${l.after}`
  if (l.after !== undefined) return `${l.field}: ${l.after}`
  return `${l.field}: ${l.before} (removed)`
}
