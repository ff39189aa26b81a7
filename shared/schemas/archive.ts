// Archiving and deleting assumption sets, calibrations, mitigation options and policy-terms sets.
import { z } from 'zod'

export const archiveSchema = z.object({
  archived: z.boolean('Say whether to archive (true) or restore (false).').default(true),
})
export type ArchiveInput = z.infer<typeof archiveSchema>

/** `?archived=` on the lists: hidden by default, or shown with the others, or alone. */
export const archivedQuerySchema = z.object({
  archived: z.enum(['hide', 'include', 'only'], 'Use archived=hide, include or only.').default('hide'),
})
export type ArchivedFilter = z.infer<typeof archivedQuerySchema>['archived']

export const ARCHIVABLE_KINDS = ['assumption_set', 'calibration', 'mitigation_option', 'policy_terms_set'] as const
export type ArchivableKind = (typeof ARCHIVABLE_KINDS)[number]
