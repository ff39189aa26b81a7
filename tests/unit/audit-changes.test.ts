// The audit log's before/after as readable "field: old → new" lines (issue "Screens a practitioner
// reads at a glance": audit log before/after as readable fields instead of JSON). Expected lines
// hand-worked from the records below.
import { describe, expect, it } from 'vitest'
import { auditChangeLines, auditValue, formatChangeLine } from '../../shared/audit/changes'

const lines = (before: unknown, after: unknown) => auditChangeLines(before, after).map(formatChangeLine)

describe('audit change lines', () => {
  it('an update lists only the fields that changed, nested fields by dotted name', () => {
    expect(lines(
      { role: 'viewer', name: 'Ana', limits: { occurrence: 50000, aggregate: null } },
      { role: 'analyst', name: 'Ana', limits: { occurrence: 75000, aggregate: null } },
    )).toEqual(['role: viewer → analyst', 'limits.occurrence: 50000 → 75000'])
  })

  it('a created record lists its values; a deleted one says removed', () => {
    expect(lines(null, { label: 'Shield 60 kA', sent: false })).toEqual(['label: Shield 60 kA', 'sent: no'])
    expect(lines({ label: 'Shield 60 kA' }, null)).toEqual(['label: Shield 60 kA (removed)'])
  })

  it('fields that appear or vanish in an update, and values that are not records', () => {
    expect(lines({ a: 1 }, { b: 2 })).toEqual(['a: 1 (removed)', 'b: 2'])
    expect(lines('old', 'new')).toEqual(['value: old → new'])
    expect(lines(null, null)).toEqual([])
  })

  it('writes values in words', () => {
    expect(auditValue(null)).toBe('—')
    expect(auditValue(true)).toBe('yes')
    expect(auditValue(['a', 'b'])).toBe('a, b')
    expect(auditValue([])).toBe('(none)')
    expect(auditValue([{ x: 1 }])).toBe('{"x":1}')
  })
})
