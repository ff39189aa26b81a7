// axe-core (WCAG 2 A and AA rules: tags wcag2a, wcag2aa) on every page of pages/, for the roles that
// see it: anonymous visitors on the public pages; the demo operator's admin on every page (the admin
// sees every section and every form); each other role on the sections its rail offers and on a
// site's, a run's and a tank's pages. Zero violations.
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join, relative, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchBrowser, openGuardedPage, type GuardedPage } from '../support/browser'
import { signInPage } from '../support/browser-session'
import { DEMO_PASSWORD } from '../../server/db/seed/accounts'
import { sectionsForRole } from '../../shared/navigation'
import type { RoleName } from '../../shared/roles'

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')
const pagesDir = resolve(import.meta.dirname, '../../pages')
// The demo operator (README "Demo sign-ins"): owns its sites, so its admin sees the edit forms too.
const account = (role: string) => `${role === 'asset_manager' ? 'asset.manager' : role}@dunmere.example`

interface AxeViolation { id: string, impact: string, help: string, nodes: { target: string[] }[] }

async function axe(page: Page): Promise<string[]> {
  await page.evaluate(axeSource)
  const violations = await page.evaluate(async () => {
    const w = window as unknown as { axe: { run: (ctx: Document, o: unknown) => Promise<{ violations: AxeViolation[] }> } }
    const r = await w.axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa'] } })
    return r.violations
  })
  return violations.map(v => `${v.impact} ${v.id} (${v.help}): ${v.nodes.slice(0, 4).map(n => n.target.join(' ')).join(', ')}${v.nodes.length > 4 ? ` and ${v.nodes.length - 4} more` : ''}`)
}

async function check(g: GuardedPage, path: string): Promise<string[]> {
  const res = await g.page.goto(`${inject('baseUrl')}${path}`, { waitUntil: 'networkidle', timeout: 90_000 })
  expect(res?.status(), path).toBeLessThan(500)
  // Every page names itself in a top-level heading; a page without one is reported, not waited for forever.
  const heading = await g.page.locator('h1').first().waitFor({ timeout: 30_000 }).then(() => true, () => false)
  await g.page.waitForTimeout(300)
  return [...(heading ? [] : [`${path}: no h1 heading (landed on ${new URL(g.page.url()).pathname})`]), ...(await axe(g.page)).map(v => `${path}: ${v}`)]
}

/** Every page file as a route pattern ("/sites/[id]/edit"). */
function pageRoutes(dir = pagesDir): string[] {
  return readdirSync(dir).flatMap((f) => {
    const full = join(dir, f)
    if (statSync(full).isDirectory()) return pageRoutes(full)
    const route = `/${relative(pagesDir, full).replace(/\.vue$/, '').replace(/(^|\/)index$/, '')}`
    return [route === '/' ? '/' : route.replace(/\/$/, '')]
  })
}

let browser: Browser
const ids: Record<string, string> = {}

beforeAll(async () => {
  browser = await launchBrowser()
  const g = await openGuardedPage(browser)
  await signInPage(g.page, inject('baseUrl'), account('admin'), DEMO_PASSWORD)
  const api = (url: string, init?: { method: string, body?: unknown, type?: string }) => g.page.evaluate(async ([u, i]) => {
    const r = await fetch(u, i ? { method: i.method, headers: { 'content-type': i.type ?? 'application/json' }, body: typeof i.body === 'string' ? i.body : JSON.stringify(i.body) } : undefined)
    return r.json()
  }, [url, init] as const)
  // The demo run of this operator's portfolio (queued at seeding) must have finished.
  let run: { id: string, state: string, mode: string } | undefined
  for (let k = 0; k < 400 && !run; k++) {
    const runs = await api('/api/runs') as { id: string, state: string, mode: string }[]
    run = runs.find(r => r.state === 'succeeded' && r.mode === 'year')
    if (!run) await g.page.waitForTimeout(1000)
  }
  ids.run = run!.id
  const sites = await api('/api/sites') as { items: { id: string, readOnly?: boolean }[] }
  ids.site = sites.items.find(s => !s.readOnly)!.id
  const site = await api(`/api/sites/${ids.site}`) as { tanks: { id: string }[] }
  ids.tank = site.tanks[0]!.id
  ids.portfolio = (await api('/api/portfolios') as { id: string }[])[0]!.id
  const sets = await api('/api/assumption-sets') as { id: string, versions: { id: string }[] }[]
  ids.assumptions = sets[0]!.id
  ids.version = sets[0]!.versions[0]!.id
  const terms = (await api('/api/policy-terms') as { id: string }[])[0]
  ids.terms = terms?.id ?? (await api('/api/policy-terms', { method: 'POST', body: { portfolioId: ids.portfolio, name: 'Accessibility check terms', description: '' } }) as { set: { id: string } }).set.id
  // A calibration of this organisation: the example impulse series (docs/examples/impulse-series.csv).
  const series = readFileSync(resolve(import.meta.dirname, '../../docs/examples/impulse-series.csv'), 'utf8').trim().split('\n').slice(1)
    .map(l => l.split(',')).map(([level, spark]) => ({ levelKv: Number(level), spark: spark!.trim() === 'yes' }))
  const calibration = await api('/api/calibrations/impulse', { method: 'POST', body: { title: 'Accessibility check series', componentClass: 'sharp_device', configuration: 'example series', equivalenceFactor: 1, equivalenceBasis: '1: test waveshape taken as the induced one', series } }) as { id: string }
  ids.calibration = calibration.id
  // A storm: the invented example feed uploaded as recorded flashes, worked by the app's worker.
  const csv = readFileSync(resolve(import.meta.dirname, '../../examples/storm-feed.csv'), 'utf8')
  await api('/api/storms/uploads?name=Accessibility%20check%20storm', { method: 'POST', body: csv, type: 'text/csv' })
  for (let k = 0; k < 120 && !ids.storm; k++) {
    const windows = await api('/api/storms/windows') as { id: string }[] | { items: { id: string }[] }
    const list = Array.isArray(windows) ? windows : windows.items
    if (list?.[0]) ids.storm = list[0].id
    else await g.page.waitForTimeout(1000)
  }
  await g.context.close()
}, 600_000)
afterAll(async () => { await browser?.close() })

/** The address of each page for the admin; null for the few that only redirect. */
function address(route: string): string | null {
  const bogus = 'not-a-real-token-0000'
  const map: Record<string, string | null> = {
    '/': null, // redirects to the overview when signed in (checked as a visitor below)
    '/sign-out': null, // signs out at once
    '/sign-in': null, // visitors only
    '/invitations/[token]': `/invitations/${bogus}`,
    '/reset-password/[token]': `/reset-password/${bogus}`,
    '/assumptions/[id]': `/assumptions/${ids.assumptions}`,
    '/assumptions/versions/[id]': `/assumptions/versions/${ids.version}`,
    '/calibration/[id]': `/calibration/${ids.calibration}`,
    '/insurance/[id]': `/insurance/${ids.terms}`,
    '/portfolios/[id]': `/portfolios/${ids.portfolio}`,
    '/results/[runId]': `/results/${ids.run}`,
    '/results/[runId]/compare': `/results/${ids.run}/compare`,
    '/results/[runId]/sites/[siteId]': `/results/${ids.run}/sites/${ids.site}`,
    '/runs/[id]': `/runs/${ids.run}`,
    '/runs/[id]/financial': `/runs/${ids.run}/financial`,
    '/runs/[id]/accumulation': `/runs/${ids.run}/accumulation`,
    '/sites/[id]': `/sites/${ids.site}`,
    '/sites/[id]/edit': `/sites/${ids.site}/edit`,
    '/sites/[id]/tanks/new': `/sites/${ids.site}/tanks/new`,
    '/storms/[id]': `/storms/${ids.storm}`,
    '/tanks/[id]': `/tanks/${ids.tank}`,
    '/tanks/[id]/edit': `/tanks/${ids.tank}/edit`,
  }
  if (route in map) return map[route]!
  if (route.includes('[')) throw new Error(`no address for ${route}: add it to the accessibility test`)
  return route
}

describe('accessibility (axe-core, WCAG 2 A and AA)', () => {
  it('public pages, signed out', async () => {
    const g = await openGuardedPage(browser)
    const found: string[] = []
    for (const path of ['/', '/sign-in', '/reset-password', '/reset-password/not-a-real-token-0000', '/invitations/not-a-real-token-0000', '/methodology', '/what-if', '/preview/results']) found.push(...await check(g, path))
    await g.context.close()
    expect(found).toEqual([])
  })

  it('every page, as the admin', async () => {
    const g = await openGuardedPage(browser)
    await signInPage(g.page, inject('baseUrl'), account('admin'), DEMO_PASSWORD)
    const routes = pageRoutes()
    expect(routes.length).toBeGreaterThan(40)
    const found: string[] = []
    for (const route of routes) {
      const path = address(route)
      if (path) found.push(...await check(g, path))
    }
    await g.context.close()
    expect(found).toEqual([])
  }, 900_000)

  it.each(['analyst', 'underwriter', 'asset_manager', 'viewer'] as RoleName[])('the pages the %s sees', async (role) => {
    const g = await openGuardedPage(browser)
    await signInPage(g.page, inject('baseUrl'), account(role), DEMO_PASSWORD)
    const paths = [...sectionsForRole(role).map(s => s.to), `/sites/${ids.site}`, `/tanks/${ids.tank}`, `/results/${ids.run}`, `/results/${ids.run}/sites/${ids.site}`, `/runs/${ids.run}`, '/profile']
    const found: string[] = []
    for (const path of paths) found.push(...await check(g, path))
    await g.context.close()
    expect(found).toEqual([])
  }, 600_000)
})
