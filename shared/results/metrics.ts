// The site metrics every result view offers (map colour, sites × metrics heatmap, comparison).
import type { MetricDef } from './types'

export const siteMetrics: MetricDef[] = [
  { key: 'ignitionPerYear', label: 'Expected fires', format: 'frequency', logScale: true },
  { key: 'sparkingPerYear', label: 'Induced sparking', format: 'frequency', logScale: true },
  { key: 'directPerYear', label: 'Direct strikes on tanks', format: 'frequency', logScale: true },
  { key: 'averageAnnualLoss', label: 'Average annual loss', format: 'money', logScale: true },
  { key: 'lossAt100Years', label: 'Loss at 100 years', format: 'money', logScale: true },
]
