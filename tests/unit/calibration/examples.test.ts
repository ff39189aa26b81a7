import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { isRecord, parseImpulseCsv, parseLightningRow, readLightningHeader, splitCsvLine, upAndDown } from '../../../shared/calibration'

const root = resolve(import.meta.dirname, '../../..')
const read = (p: string) => readFileSync(resolve(root, p), 'utf8')

describe('example files (README, docs/examples, shipped under /examples)', () => {
  it('ships the same files the README documents', () => {
    for (const name of ['lightning-records.csv', 'impulse-series.csv']) expect(read(`public/examples/${name}`)).toBe(read(`docs/examples/${name}`))
  })

  it('are valid files of their kind', () => {
    const [header, ...rows] = read('docs/examples/lightning-records.csv').trim().split('\n')
    const { columns, problems } = readLightningHeader(header!)
    expect(problems).toEqual([])
    expect(rows.every(r => isRecord(parseLightningRow(splitCsvLine(r), columns)))).toBe(true)
    // The impulse example is the hand-worked series of impulse.test.ts: U50 = 92.8 kV.
    expect(upAndDown(parseImpulseCsv(read('docs/examples/impulse-series.csv'))).u50Kv).toBeCloseTo(92.8, 10)
  })
})
