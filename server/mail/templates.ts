// Every message Stormledger sends, in one place: plain text, short, with the product's name and
// what to do next. Each template returns the subject and the body; queueMail() sends it.
import { roleLabels } from '../../shared/roles'
import type { RoleName } from '../../shared/navigation'
import { CAUTION_FULL } from '../../shared/caution'
import { formatCount, formatFrequency, formatInterval, formatMoney, formatOnceIn } from '../../shared/format'
import type { runs } from '../db/schema'
import type { PortfolioResult } from '../results/queries'
import { settings } from '../settings'

export interface MailContent { subject: string, text: string }

const SIGNATURE = '\n\n— Stormledger\nLightning-ignition risk for non-conducting storage tanks'

const article = (word: string) => (/^[aeiou]/i.test(word) ? 'an' : 'a')

export function invitationMail(o: { organisationName: string, role: RoleName, invitedBy: string, link: string, expiresAt: Date }): MailContent {
  const role = roleLabels[o.role].toLowerCase()
  return {
    subject: `You are invited to ${o.organisationName} on Stormledger`,
    text: `${o.invitedBy} invites you to join ${o.organisationName} on Stormledger as ${article(role)} ${role}.

Open this link to accept and set your password:
${o.link}

The link works once and expires on ${o.expiresAt.toUTCString()}.
If you did not expect this invitation, ignore this message; nothing happens unless the link is opened.${SIGNATURE}`,
  }
}

export function passwordResetMail(o: { link: string }): MailContent {
  return {
    subject: 'Reset your Stormledger password',
    text: `Someone asked to reset the password of the Stormledger account for this e-mail address.

To choose a new password, open this link within one hour:
${o.link}

The link works once. Setting a new password signs you out everywhere else.
If you did not ask for this, ignore this message; your password stays as it is.${SIGNATURE}`,
  }
}

export function passwordChangedMail(o: { signInLink: string, resetLink: string }): MailContent {
  return {
    subject: 'Your Stormledger password was changed',
    text: `The password of your Stormledger account was just changed, and every other session was signed out.

If that was you, there is nothing to do: ${o.signInLink}
If it was not, reset your password now: ${o.resetLink}${SIGNATURE}`,
  }
}

export function referralAssignedMail(o: { organisationName: string, siteName: string, by: string, body: string, dueOn: string | null, link: string }): MailContent {
  const excerpt = o.body.length > 600 ? `${o.body.slice(0, 600)}…` : o.body
  return {
    subject: `Referral for you: ${o.siteName}${o.dueOn ? `, due ${o.dueOn}` : ''}`,
    text: `${o.by} of ${o.organisationName} gave you a referral on the site ${o.siteName}${o.dueOn ? `, due on ${o.dueOn} (UTC)` : ''}:

${excerpt.split('\n').map(l => `> ${l}`).join('\n')}

Open it to reply, or to set it in review, accepted or declined:
${o.link}${SIGNATURE}`,
  }
}

export function importEndedMail(o: { fileName: string, outcome: { ok: true, summary: { sites: { new: number, changed: number }, tanks: { new: number, changed: number }, structures: { new: number, changed: number } } } | { ok: false, message: string }, link: string }): MailContent {
  if (!o.outcome.ok) {
    return {
      subject: `Import of ${o.fileName} did not go through`,
      text: `The inventory import of ${o.fileName} did not go through; nothing of it was written.

${o.outcome.message}

The import page shows what happened and lets you commit it again or upload a corrected file:
${o.link}${SIGNATURE}`,
    }
  }
  const s = o.outcome.summary
  const line = (label: string, c: { new: number, changed: number }) => `- ${label}: ${c.new.toLocaleString('en-GB')} new, ${c.changed.toLocaleString('en-GB')} changed`
  return {
    subject: `Import of ${o.fileName} is done`,
    text: `The inventory import of ${o.fileName} is written, all of it in one go:

${line('Sites', s.sites)}
${line('Tanks', s.tanks)}
${line('Structures', s.structures)}

The import page has the details:
${o.link}

Run a new simulation to see the imported sites and tanks in the results.${SIGNATURE}`,
  }
}

export function stormAlertMail(o: { organisationName: string, windowLabel: string, threshold: number, tanks: Array<{ tag: string, siteName: string, ignition: number }>, link: string }): MailContent {
  const lines = o.tanks.slice(0, 25).map(t => `- ${t.siteName} · ${t.tag}: ${(100 * t.ignition).toFixed(1)} % probability of a lightning fire`)
  const more = o.tanks.length > 25 ? `\n…and ${o.tanks.length - 25} more in the report.` : ''
  return {
    subject: `Storm alert: ${o.tanks.length} tank${o.tanks.length === 1 ? '' : 's'} of ${o.organisationName} above ${(100 * o.threshold).toFixed(1)} % ignition probability`,
    text: `The recorded flashes of the storm ${o.windowLabel} give these tanks an ignition probability above your organisation's alert threshold of ${(100 * o.threshold).toFixed(1)} %, highest first — inspect them first:

${lines.join('\n')}${more}

The storm report ranks every tank, names the flash that drives each figure and gives the expected fires and losses:
${o.link}

These are probabilities computed from lightning-location records and illustrative assumptions; they rank where to look and are no finding that a tank burned. You receive this because you asked for storm alerts in Stormledger.${SIGNATURE}`,
  }
}

// ---------------------------------------------------------------- run ended

type Run = typeof runs.$inferSelect

/** The run in the product's words: "simulated years" (never "year mode") or frequencies. */
export function runDescription(run: Pick<Run, 'mode' | 'years'>): string {
  return run.mode === 'year' ? `simulated-years run (${formatCount(run.years)} years per site)` : 'frequency run'
}

/** The run-ended e-mail; money in the organisation's `currency` (ISO 4217 code). */
export function runEndedMessage(input: { run: Run, recipientName: string, portfolio: PortfolioResult | null, currency: string }): { subject: string, text: string } {
  const { run, portfolio, currency } = input
  const link = `${settings.publicUrl}/runs/${run.id}`
  const greeting = `Hello ${input.recipientName || 'there'},`
  const what = `the ${runDescription(run)} of portfolio "${run.portfolioName}" (seed ${run.seed})`
  if (run.state === 'succeeded' && portfolio) {
    const f = portfolio.figures
    const lines = [
      greeting, '',
      `Stormledger finished ${what}.`, '',
      `Expected fires: ${formatFrequency(f.ignition.rate)} — ${formatOnceIn(f.ignition.rate)} (95 %: ${formatInterval(f.ignition.rate, f.ignition.lo, f.ignition.hi, '/yr')})`,
      `Induced sparking: ${formatInterval(f.sparking.rate, f.sparking.lo, f.sparking.hi, '/yr')}`,
      `Direct strikes: ${formatInterval(f.direct.rate, f.direct.lo, f.direct.hi, '/yr')}`,
      `Average annual loss (AAL): ${formatMoney(f.expectedAnnualLoss.rate, currency)} per year`,
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
