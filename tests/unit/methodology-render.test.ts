import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { assumptionTableMarkdown, formatDefault, renderMethodology, type ParameterRow } from '../../server/methodology/render'
import { parameterRows } from '../../server/methodology/engine-facts'
import { CAUTION_TEXT } from '../../shared/caution'

const doc = readFileSync(resolve(import.meta.dirname, '../../docs/methodology.md'), 'utf8')

describe('methodology rendering', () => {
  it('writes defaults for reading', () => {
    // House style (STYLE.md): large and small magnitudes in "× 10ⁿ" form; lists and choices in words.
    expect(formatDefault(1.2e8)).toBe('1.2 × 10⁸')
    expect(formatDefault(1e-6)).toBe('1.0 × 10⁻⁶')
    expect(formatDefault(0.65)).toBe('0.65')
    expect(formatDefault([])).toBe('none')
    expect(formatDefault('egm')).toBe('electrogeometric model')
  })

  it('builds one table row per parameter and escapes pipes in cells', () => {
    const rows: ParameterRow[] = [
      { key: 'a', label: 'Coefficient A', unit: 'm', default: 10, source: 'IEC 62305-1' },
      { key: 'b', label: 'Odd | label', unit: '', default: 'x', source: 's' },
    ]
    const table = assumptionTableMarkdown(rows).split('\n')
    // A GFM table: header, delimiter, one line per row (GitHub Flavored Markdown spec, tables).
    expect(table).toHaveLength(4)
    expect(table[2]).toBe('| Coefficient A | 10 | m | IEC 62305-1 |')
    expect(table[3]).toContain('Odd \\| label')
  })

  it('renders the document with every assumption, the caution twice, the formulas and the engine version', () => {
    const html = renderMethodology(doc, parameterRows, 'v-test')
    // Every parameter the engine declares appears (its label, with & escaped as HTML does).
    for (const p of parameterRows) expect(html).toContain(p.label.replace(/&/g, '&amp;'))
    // The caution wording of shared/caution.ts, at the top and in the "how to use" section (PRODUCT.md "Cautions").
    expect(html.split(CAUTION_TEXT.short).length - 1).toBe(2)
    // Formulas stay HTML with sub/superscripts, e.g. Anderson's Ng = 0.04·Td^1.25 (MODEL.md §1).
    expect(html).toContain('N<sub>g</sub> = 0.04 · T<sub>d</sub><sup>1.25</sup>')
    expect(html).toContain('<code data-engine-version>v-test</code>')
    expect(html).not.toContain('<!-- ASSUMPTION_TABLE -->')
    expect(html).toContain('<div class="methodology-table"><table>')
  })
})
