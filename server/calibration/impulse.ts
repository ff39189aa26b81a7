// Impulse calibration: U50 by the up-and-down method and U50, σ by maximum likelihood, side by side,
// with the stated equivalence factor from test level to field potential.
import type { H3Event } from 'h3'
import { gzipSync } from 'node:zlib'
import { analyseImpulseSeries, CalibrationInputError, impulseCsv, parseImpulseCsv, type ImpulseApplication } from '../../shared/calibration'
import type { ImpulseCalibrationInput } from '../../shared/schemas/calibration'
import { useDb } from '../db'
import { calibrationFiles, calibrations } from '../db/schema'
import type { Member } from '../utils/auth'
import { recordAudit } from '../utils/audit'
import { badRequest } from '../utils/errors'
import { sha256 } from './lightning'
import { forgetCalibrationContent, storeCalibrationContent } from './files'

export async function runImpulseCalibration(member: Member, event: H3Event, input: ImpulseCalibrationInput) {
  let series: ImpulseApplication[] = input.series
  let fileName = 'entered-series.csv'
  let text: string
  if (input.source) {
    try {
      series = parseImpulseCsv(input.source.text)
    } catch (error) {
      if (error instanceof CalibrationInputError) badRequest(`The file ${input.source.fileName} cannot be used. ${error.message}`)
      throw error
    }
    fileName = input.source.fileName
    text = input.source.text
  } else {
    text = impulseCsv(series)
  }
  const results = analyseImpulseSeries(series, input.equivalenceFactor, input.minimumUseful)
  if (!results.upAndDown && !results.likelihood) {
    badRequest(`Neither method can use this series. Up-and-down: ${results.upAndDownProblem} Maximum likelihood: ${results.likelihoodProblem}`)
  }
  const inputs = { ...input, series, source: input.source ? { fileName: input.source.fileName } : null }
  // The file goes to object storage first: a failed put leaves no row; a failed transaction removes the object.
  const content = await storeCalibrationContent(member.organisationId, gzipSync(text))
  return useDb().transaction(async (tx) => {
    const [file] = await tx.insert(calibrationFiles).values({
      organisationId: member.organisationId, kind: 'impulse', fileName, byteSize: Buffer.byteLength(text), rowCount: series.length, sha256: sha256(text),
      ...content, summary: { applications: series.length, sparks: series.filter(a => a.spark).length, entered: !input.source }, uploadedBy: member.user.id,
    }).returning({ id: calibrationFiles.id })
    const [row] = await tx.insert(calibrations).values({
      organisationId: member.organisationId, kind: 'impulse', title: input.title, fileId: file!.id, inputs, results: { ...results, file: { id: file!.id, name: fileName, sha256: sha256(text), rows: series.length } }, createdBy: member.user.id,
    }).returning()
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'create', entity: 'calibration', entityId: row!.id, after: { kind: 'impulse', title: input.title, componentClass: input.componentClass, fileId: file!.id, upAndDownU50Kv: results.upAndDown?.u50Kv ?? null, likelihoodU50Kv: results.likelihood?.u50Kv ?? null, sigma: results.likelihood?.sigma ?? null, equivalenceFactor: input.equivalenceFactor } }, { tx, event })
    return row!
  }).catch(async (error: unknown) => {
    await forgetCalibrationContent(content.contentKey)
    throw error
  })
}
