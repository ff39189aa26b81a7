// What the methodology page takes from the engine: the assumption metadata and the engine version.
// The one place to point at the engine's public entry once it is in the tree.
import { assumptionParameterMeta } from '../../shared/engine/assumptions'
import type { ParameterRow } from './render'

export const parameterRows: readonly ParameterRow[] = assumptionParameterMeta
export const engineVersion: string = 'not yet stamped'
