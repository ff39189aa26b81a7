// Demo seeder: every organisation gets the documented defaults as its first assumption set.
import { defaultAssumptions } from '../../../shared/engine/assumptions'
import type { Database } from '../index'
import { assumptionSets, assumptionSetVersions, organisations } from '../schema'
import type { Seeder } from './index'

export const DEMO_ASSUMPTION_SET = 'Documented defaults'

export const assumptionsSeeder: Seeder = {
  name: 'assumptions',
  async run(db: Database) {
    const orgs = await db.select({ id: organisations.id }).from(organisations)
    for (const org of orgs) {
      const [set] = await db.insert(assumptionSets).values({
        organisationId: org.id, name: DEMO_ASSUMPTION_SET,
        description: 'The published and illustrative defaults of the methodology; calibrate before relying on results.',
      }).onConflictDoNothing().returning()
      if (!set) continue
      await db.insert(assumptionSetVersions).values({
        assumptionSetId: set.id, version: 1, parameters: { ...defaultAssumptions }, note: 'Defaults as documented in the methodology',
      })
    }
  },
}
