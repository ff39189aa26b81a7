// Mitigation options saved from the tank what-if, kept per organisation (and, when opened from a
// run's site page, with that run, site and tank), so they survive a reload and can be sent to the
// capital plan as a candidate action.
import { doublePrecision, index, jsonb, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { runs } from './runs'
import { capitalActions } from './capital'
import type { ParamChange, WhatIfParams } from '../../../shared/results/whatif-params'
import type { WhatIfFigures } from '../../../shared/schemas/whatif'

export const whatifOptions = pgTable('whatif_options', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  /** The run the what-if was opened from (null: opened on its own). */
  runId: uuid('run_id').references(() => runs.id, { onDelete: 'set null' }),
  /** The run's site and tank (inventory ids, no foreign key: the option stays readable after they go). */
  siteId: uuid('site_id'),
  tankId: uuid('tank_id'),
  tankTag: text('tank_tag'),
  label: text('label').notNull(),
  params: jsonb('params').$type<WhatIfParams>().notNull(),
  changes: jsonb('changes').$type<ParamChange[]>().notNull(),
  /** Per year: the what-if's figures with the option and at the starting point. */
  figures: jsonb('figures').$type<WhatIfFigures>().notNull(),
  baselineFigures: jsonb('baseline_figures').$type<WhatIfFigures | null>(),
  engineVersion: text('engine_version').notNull(),
  /** Where the mast was placed when sent (site coordinates, m), and the action it became. */
  mastXM: doublePrecision('mast_x_m'),
  mastYM: doublePrecision('mast_y_m'),
  capitalActionId: uuid('capital_action_id').references(() => capitalActions.id, { onDelete: 'set null' }),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('whatif_options_org_run_idx').on(t.organisationId, t.runId, t.siteId),
  index('whatif_options_run_idx').on(t.runId),
  index('whatif_options_action_idx').on(t.capitalActionId),
  index('whatif_options_created_by_idx').on(t.createdBy),
])
