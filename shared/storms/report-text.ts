// Words for a storm report's money figures, shared by the page and the workbook (figures through
// shared/format.ts): an insured loss with its method, "no terms" for a site without the reader's
// terms — never a zero — and the method in words.
import { formatCount, formatMoney } from '../format'
import type { StormReportSite } from './types'

export const NO_TERMS_TEXT = 'no terms'
export const NOT_COMPUTED_TEXT = 'not computed (storm worked before per-site losses were kept)'

export function methodText(site: Pick<StormReportSite, 'method' | 'samples'>): string {
  if (site.method === 'exact') return 'exact (every burning set, quadrature over the damage ratios)'
  if (site.method === 'closed-form') return 'closed form (no deductible or limit: share × ground-up)'
  if (site.method === 'monte-carlo') return `Monte Carlo, ${formatCount(site.samples ?? 0)} seeded draws`
  return ''
}

/** "USD 39,754", "USD 39,635 ± 251 (s.e.)", "no terms" or "not computed …". */
export function insuredText(site: Pick<StormReportSite, 'terms' | 'expectedInsuredLoss' | 'insuredSe'>, currency: string): string {
  if (site.terms === 'none') return NO_TERMS_TEXT
  if (site.terms === 'not computed' || site.expectedInsuredLoss === null) return NOT_COMPUTED_TEXT
  return site.insuredSe ? `${formatMoney(site.expectedInsuredLoss, currency)} ± ${formatMoney(site.insuredSe, currency)} (s.e.)` : formatMoney(site.expectedInsuredLoss, currency)
}
