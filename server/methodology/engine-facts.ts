// What the methodology page takes from the engine: the assumption metadata and the engine version.
import { ENGINE_VERSION, assumptionParameterMeta } from '../../shared/engine'
import type { ParameterRow } from './render'

export const parameterRows: readonly ParameterRow[] = assumptionParameterMeta
export const engineVersion: string = ENGINE_VERSION
