// The methodology page: docs/methodology.md rendered to HTML, with the assumption table generated
// from the engine's parameter metadata, the caution and the engine version filled in.
import MarkdownIt from 'markdown-it'
import { CAUTION_TEXT } from '../../shared/caution'
import { formatNumber } from '../../shared/format'

/** The fields of one assumption parameter the table shows (the engine's AssumptionParameterMeta). */
export interface ParameterRow {
  key: string
  label: string
  unit: string
  default: number | string | number[] | null
  source: string
  options?: readonly string[]
}

const CHOICE_LABELS: Record<string, string> = {
  egm: 'electrogeometric model',
  collection_area: 'collection area (3H)',
  power_law: 'power law',
  lognormal: 'log-normal',
  empirical: 'empirical',
  anderson: 'Anderson (0.04·Td^1.25)',
  iec: 'IEC (0.1·Td)',
}

/** A default value for reading: plain for ordinary magnitudes, "1.2 × 10⁸" otherwise. */
export function formatDefault(value: ParameterRow['default']): string {
  if (value === null) return 'none (Rusk’s value is used)'
  if (Array.isArray(value)) return value.length === 0 ? 'none' : value.map(v => String(v)).join(', ')
  if (typeof value === 'string') return CHOICE_LABELS[value] ?? value
  const abs = Math.abs(value)
  return abs === 0 || (abs >= 0.001 && abs < 100_000) ? String(value) : formatNumber(value, 2)
}

const cell = (text: string) => text.replace(/\\/g, '\\\\').replace(/\|/g, '\\|').replace(/\n/g, ' ')

/** The assumption table as Markdown: one row per parameter, in the metadata's order. */
export function assumptionTableMarkdown(rows: readonly ParameterRow[]): string {
  const lines = ['| Parameter | Default | Unit | Source |', '|---|---|---|---|']
  for (const r of rows) {
    const options = r.options?.length ? ` (choices: ${r.options.map(o => CHOICE_LABELS[o] ?? o).join('; ')})` : ''
    lines.push(`| ${cell(r.label)} | ${cell(formatDefault(r.default))}${cell(options)} | ${cell(r.unit || '—')} | ${cell(r.source)} |`)
  }
  return lines.join('\n')
}

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

/**
 * Markdown → HTML. The document is the project's own file, so its inline HTML (formulas) is kept;
 * nothing typed by users goes through here.
 */
export function renderMethodology(markdown: string, parameters: readonly ParameterRow[], engineVersion: string): string {
  const caution = `<aside class="methodology-caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION_TEXT.short)} ${escapeHtml(CAUTION_TEXT.long)}</aside>`
  const source = markdown
    .replace('<!-- ASSUMPTION_TABLE -->', assumptionTableMarkdown(parameters))
    .replaceAll('<!-- CAUTION -->', caution)
    .replaceAll('<!-- ENGINE_VERSION -->', `<code data-engine-version>${escapeHtml(engineVersion)}</code>`)
  const md = new MarkdownIt({ html: true, linkify: false, typographer: false })
  return md.render(source).replace(/<table>/g, '<div class="methodology-table"><table>').replace(/<\/table>/g, '</table></div>')
}
