// The catalogue option "Send to capital plan" first offers for a saved what-if option. Expected
// values hand-worked from the catalogue below.
import { describe, expect, it } from 'vitest'
import { suggestCatalogueOption, type CatalogueChoice } from '../../shared/capital/whatif-send'

const catalogue: CatalogueChoice[] = [
  { id: 'shield-40', kind: 'shield', name: 'Shield 40 kA', shieldRatingKa: 40, mastHeightM: null },
  { id: 'shield-150', kind: 'shield', name: 'Shield 150 kA', shieldRatingKa: 150, mastHeightM: null },
  { id: 'shield-80', kind: 'shield', name: 'Shield 80 kA', shieldRatingKa: 80, mastHeightM: null },
  { id: 'shield-60-old', kind: 'shield', name: 'Shield 60 kA (archived)', shieldRatingKa: 60, mastHeightM: null, archivedAt: '2026-01-01T00:00:00Z' },
  { id: 'mast-30', kind: 'mast', name: 'Mast 30 m', shieldRatingKa: null, mastHeightM: 30 },
  { id: 'mast-15', kind: 'mast', name: 'Mast 15 m', shieldRatingKa: null, mastHeightM: 15 },
  { id: 'grounding', kind: 'grounding', name: 'Grounding', shieldRatingKa: null, mastHeightM: null },
]

describe('suggestCatalogueOption', () => {
  it('a shield of 60 kA: the lowest-rated active shield at or above it (80 kA; the archived 60 kA is never offered)', () => {
    expect(suggestCatalogueOption({ shieldKa: 60, mastHeightM: 0 }, catalogue)?.id).toBe('shield-80')
  })
  it('a shield above every rating: the highest-rated shield', () => {
    expect(suggestCatalogueOption({ shieldKa: 200, mastHeightM: 0 }, catalogue)?.id).toBe('shield-150')
  })
  it('a mast of 20 m: the mast of nearest height (15 m is 5 m off, 30 m is 10 m off)', () => {
    expect(suggestCatalogueOption({ shieldKa: 60, mastHeightM: 20 }, catalogue)?.id).toBe('mast-15')
  })
  it('neither a shield nor a mast, or no such option: nothing suggested', () => {
    expect(suggestCatalogueOption({ shieldKa: 0, mastHeightM: 0 }, catalogue)).toBeNull()
    expect(suggestCatalogueOption({ shieldKa: 60, mastHeightM: 0 }, catalogue.filter(o => o.kind !== 'shield'))).toBeNull()
  })
})
