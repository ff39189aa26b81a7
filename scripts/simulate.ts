// npm run simulate -- --portfolio <name or id> [--organisation <name>] [--assumptions <name@version>]
//                     [--mode frequency|year] [--seed N] [--years N] [--target-rse X] [--negligible-rate X] [--chunk-size N] [--storm-clustering]
//                     [--assumption-draws K] [--wait]
// Enqueues a run (workers must be running: npm start or npm run worker); with --wait, shows a
// progress bar and prints the headline results (with --assumption-draws, their 5–95 % assumption band).
import { parseArgs } from 'node:util'
import { and, desc, eq, ilike } from 'drizzle-orm'
import { startRunSchema } from '../shared/schemas/runs'
import { formatFrequency, formatMoney, formatOnceIn } from '../shared/format'
import { closeDb, useDb } from '../server/db/index'
import { assumptionSets, assumptionSetVersions, organisations, portfolios } from '../server/db/schema'
import { stopBoss } from '../server/jobs/queue'
import { getRun } from '../server/runs/queries'
import { portfolioResult } from '../server/results/queries'
import { startRun } from '../server/runs/start'
import { AppError } from '../server/utils/errors'

class UsageError extends Error {}
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

const { values } = parseArgs({
  options: {
    'portfolio': { type: 'string' }, 'organisation': { type: 'string' }, 'assumptions': { type: 'string' },
    'mode': { type: 'string', default: 'frequency' }, 'seed': { type: 'string' }, 'years': { type: 'string' },
    'target-rse': { type: 'string' }, 'negligible-rate': { type: 'string' }, 'chunk-size': { type: 'string' }, 'storm-clustering': { type: 'boolean', default: false }, 'assumption-draws': { type: 'string' }, 'wait': { type: 'boolean', default: false },
  },
  strict: true,
})

async function findPortfolio(nameOrId: string, organisation?: string) {
  const db = useDb()
  const rows = await db.select({ id: portfolios.id, name: portfolios.name, organisationId: portfolios.organisationId, organisation: organisations.name, currency: organisations.currency })
    .from(portfolios).innerJoin(organisations, eq(organisations.id, portfolios.organisationId))
    .where(and(
      UUID.test(nameOrId) ? eq(portfolios.id, nameOrId) : ilike(portfolios.name, nameOrId),
      organisation ? ilike(organisations.name, organisation) : undefined,
    ))
  if (rows.length === 0) throw new UsageError(`No portfolio named "${nameOrId}"${organisation ? ` in "${organisation}"` : ''}.`)
  if (rows.length > 1) throw new UsageError(`"${nameOrId}" names portfolios in several organisations (${rows.map(r => r.organisation).join(', ')}); add --organisation "<name>".`)
  return rows[0]!
}

async function findVersion(organisationId: string, spec?: string) {
  const db = useDb()
  const [name, versionText] = spec ? spec.split('@') : [undefined, undefined]
  const rows = await db.select({ id: assumptionSetVersions.id, version: assumptionSetVersions.version, set: assumptionSets.name })
    .from(assumptionSetVersions).innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSets.organisationId, organisationId), name ? ilike(assumptionSets.name, name) : undefined,
      versionText ? eq(assumptionSetVersions.version, Number(versionText)) : undefined))
    .orderBy(desc(assumptionSetVersions.createdAt))
  if (rows.length === 0) throw new UsageError(spec ? `No assumption set version "${spec}" in this organisation (use name@version).` : 'This organisation has no assumption set yet.')
  return rows[0]!
}

function bar(share: number, width = 30) {
  const filled = Math.round(share * width)
  return `[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${(share * 100).toFixed(0).padStart(3)} %`
}

async function main() {
  if (!values.portfolio) throw new UsageError('--portfolio <name or id> is required.')
  const portfolio = await findPortfolio(values.portfolio, values.organisation)
  const version = await findVersion(portfolio.organisationId, values.assumptions)
  const input = startRunSchema.safeParse({
    portfolioId: portfolio.id, assumptionVersionId: version.id, mode: values.mode,
    seed: values.seed === undefined ? undefined : Number(values.seed),
    years: values.years === undefined ? undefined : Number(values.years),
    targetRse: values['target-rse'] === undefined ? undefined : Number(values['target-rse']),
    negligibleRatePerYear: values['negligible-rate'] === undefined ? undefined : Number(values['negligible-rate']),
    chunkSize: values['chunk-size'] === undefined ? undefined : Number(values['chunk-size']),
    stormClustering: values['storm-clustering'],
    assumptionDraws: values['assumption-draws'] === undefined ? undefined : Number(values['assumption-draws']),
  })
  if (!input.success) throw new UsageError(input.error.issues.map(i => `${String(i.path[0])}: ${i.message}`).join('\n'))
  const run = await startRun(input.data, { userId: null, organisationId: portfolio.organisationId })
  console.error(`Run ${run.id} queued: ${portfolio.name} (${portfolio.organisation}), ${version.set} v${version.version}, ${run.mode === 'year' ? `simulated years (${run.years} per site)` : 'frequencies'}, seed ${run.seed}, ${run.sitesTotal} sites in ${run.chunksTotal} chunks.`)
  if (!values.wait) {
    console.log(JSON.stringify({ runId: run.id, seed: run.seed, state: run.state }))
    return
  }
  for (;;) {
    const current = await getRun(portfolio.organisationId, run.id)
    if (!current) throw new Error('the run disappeared')
    const line = `${bar(current.progress.share)} ${current.progress.sitesDone}/${current.progress.sitesTotal} sites`
    if (process.stderr.isTTY) process.stderr.write(`\r${line}`)
    if (!['queued', 'running'].includes(current.state)) {
      if (process.stderr.isTTY) process.stderr.write('\n')
      if (current.state !== 'succeeded' || !current.results) {
        console.error(`Run ${current.state}: ${current.errorMessage ?? ''}`)
        process.exitCode = 1
        return
      }
      const r = current.results
      console.error(`Expected fires ${formatFrequency(r.ignitionRate)} (${formatOnceIn(r.ignitionRate)}); induced sparking ${formatFrequency(r.sparkingRate)}; direct strikes ${formatFrequency(r.directRate)}; average annual loss (AAL) ${formatMoney(r.expectedAnnualLoss, portfolio.currency)}/yr.`)
      const draws = (await portfolioResult(current.id))?.draws ?? null
      if (draws) {
        const b = draws.bands
        const range = (x: { p05: number, p95: number }) => `${formatFrequency(x.p05)}–${formatFrequency(x.p95)}`
        console.error(`Assumption band 5–95 % over ${draws.draws} draws (apart from the simulation interval): expected fires ${range(b.ignition)}; induced sparking ${range(b.sparking)}; direct strikes ${range(b.direct)}; AAL ${formatMoney(b.expectedAnnualLoss.p05, portfolio.currency)}–${formatMoney(b.expectedAnnualLoss.p95, portfolio.currency)}/yr.`)
        for (const row of draws.years?.aggregate.filter(r => r.returnPeriodYears === 100 || r.returnPeriodYears === 250) ?? []) {
          console.error(`Assumption band 5–95 % of the aggregate loss at ${row.returnPeriodYears} years (draws re-simulated over ${draws.years!.years} years): ${row.band ? `${formatMoney(row.band.p05, portfolio.currency)}–${formatMoney(row.band.p95, portfolio.currency)}` : 'too few losses in the draws\' years'}.`)
        }
        const top = draws.sensitivity[0]?.indices[0]
        if (top) console.error(`Largest share of the expected-fires band: ${top.label} (total effect ${(100 * top.totalEffect.estimate).toFixed(0)} % ± ${(100 * top.totalEffect.se).toFixed(0)} %).`)
      } else console.error('No assumption draws in this run.')
      console.log(JSON.stringify({ runId: current.id, seed: current.seed, state: current.state, inputHash: current.inputHash, elapsedSeconds: current.progress.elapsedSeconds, currency: portfolio.currency, results: r, assumptionBands: draws }))
      return
    }
    await new Promise(res => setTimeout(res, 1000))
  }
}

main().catch((error) => {
  if (error instanceof UsageError || error instanceof AppError) console.error(`simulate: ${error.message}`)
  else console.error(`simulate failed: ${(error as Error).stack ?? error}`)
  process.exitCode = 1
}).finally(async () => {
  await stopBoss().catch(() => {})
  await closeDb().catch(() => {})
})
