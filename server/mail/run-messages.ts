// The e-mail sent when a run ends: headline figures and a link on success, the reason on failure.
import { CAUTION_FULL } from '../../shared/caution'
import { formatFrequency, formatInterval, formatMoney, formatOnceIn } from '../../shared/format'
import type { runs } from '../db/schema'
import type { PortfolioResult } from '../results/queries'
import { settings } from '../settings'

type Run = typeof runs.$inferSelect

export function runEndedMessage(input: { run: Run, recipientName: string, portfolio: PortfolioResult | null }): { subject: string, text: string } {
  const { run, portfolio } = input
  const link = `${settings.publicUrl}/runs/${run.id}`
  const greeting = `Hello ${input.recipientName || 'there'},`
  const what = `the ${run.mode}-mode run of portfolio "${run.portfolioName}" (seed ${run.seed})`
  if (run.state === 'succeeded' && portfolio) {
    const f = portfolio.figures
    const lines = [
      greeting, '',
      `Stormledger finished ${what}.`, '',
      `Expected fires: ${formatFrequency(f.ignition.rate)} — ${formatOnceIn(f.ignition.rate)}`,
      `Induced sparking: ${formatInterval(f.sparking.rate, f.sparking.lo, f.sparking.hi, '/yr')}`,
      `Direct strikes: ${formatInterval(f.direct.rate, f.direct.lo, f.direct.hi, '/yr')}`,
      `Average annual loss: ${formatMoney(f.expectedAnnualLoss.rate)} per year`,
      '', `Results: ${link}`, '', CAUTION_FULL, '', '— Stormledger',
    ]
    return { subject: `Stormledger: run finished — ${run.portfolioName}`, text: lines.join('\n') }
  }
  const reason = run.state === 'cancelled' ? 'It was cancelled.' : `It failed: ${run.errorMessage ?? 'unknown cause'}`
  return {
    subject: `Stormledger: run ${run.state} — ${run.portfolioName}`,
    text: [greeting, '', `Stormledger did not finish ${what}. ${reason}`, '', `Details: ${link}`, '', '— Stormledger'].join('\n'),
  }
}
