// The command-line entry, spawned as the lead will wire it (tsx).
import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { makeSite, makeTank } from './fixtures'

const root = fileURLToPath(new URL('../../..', import.meta.url))
const dir = mkdtempSync(join(tmpdir(), 'calc-'))

function calc(...args: string[]) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(root, 'scripts/calc.ts'), ...args], { cwd: root, encoding: 'utf8' })
  return { code: r.status, out: r.stdout, err: r.stderr }
}

function file(name: string, content: unknown): string {
  const path = join(dir, name)
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content))
  return path
}

describe('calc', () => {
  it('prints JSON results for the documented example', () => {
    const r = calc('examples/site.json', '--mode', 'quadrature')
    expect(r.code).toBe(0)
    const out = JSON.parse(r.out)
    expect(out.mode).toBe('quadrature')
    expect(out.sites[0].tanks).toHaveLength(4)
  })
  it('runs frequency and year modes on a small site', () => {
    const input = file('ok.json', { site: makeSite([makeTank()]), assumptions: { currentLaw: 'lognormal' } })
    const f = calc(input, '--seed', '3', '--target-rse', '0.05')
    expect(f.code).toBe(0)
    expect(JSON.parse(f.out).sites[0].tanks[0].sparking.rate).toBeGreaterThan(0)
    const y = calc(input, '--mode', 'year', '--years', '500', '--events')
    expect(y.code).toBe(0)
    expect(JSON.parse(y.out).sites[0].yearLosses).toHaveLength(500)
  })
  it('marks figures stopped by the negligible-rate rule in its JSON, and takes the rule as an option', () => {
    // A lone tank at a flash density so low that sparking is far below the default 1e-5 /yr (invented input).
    const input = file('faint.json', { site: makeSite([makeTank()], [], { flashDensity: 2e-5 }) })
    const on = JSON.parse(calc(input, '--target-rse', '0.01').out)
    expect(on.negligibleRatePerYear).toBe(1e-5) // the documented default
    expect(on.sites[0].tanks[0].sparking.upperBoundOnly).toBe(true)
    expect(on.sites[0].tanks[0].sparking.lo).toBe(0) // an upper bound has no lower end
    const off = JSON.parse(calc(input, '--target-rse', '0.01', '--negligible-rate', '0').out)
    expect(off.sites[0].tanks[0].sparking.upperBoundOnly).toBeUndefined()
    expect(calc(input, '--negligible-rate', '-1').code).not.toBe(0)
  })
  it('bad site data: message on stderr, non-zero exit', () => {
    const r = calc(file('bad.json', { site: makeSite([makeTank({ heightM: -3 })]) }))
    expect(r.code).not.toBe(0)
    expect(r.err).toMatch(/sites\[0\][\s\S]*tanks\.0\.heightM: tank height must be above 0 m/)
    expect(r.out).toBe('')
  })
  it('bad assumptions: message on stderr, non-zero exit', () => {
    const r = calc(file('bad-a.json', { site: makeSite([makeTank()]), assumptions: { returnStrokeVelocity: 4e8 } }))
    expect(r.code).not.toBe(0)
    expect(r.err).toMatch(/below the speed of light/)
  })
  it('unreadable input, broken JSON and unknown options are refused', () => {
    expect(calc(join(dir, 'missing.json')).err).toMatch(/cannot read/)
    const broken = calc(file('broken.json', '{ "site": '))
    expect(broken.code).not.toBe(0)
    expect(broken.err).toMatch(/not valid JSON/)
    const flag = calc('examples/site.json', '--mode', 'sideways')
    expect(flag.code).not.toBe(0)
    expect(flag.err).toMatch(/--mode must be frequency, year or quadrature/)
  })
})
