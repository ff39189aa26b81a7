// The demo scenario's organisations and people (all invented): an insurer, a broker and two
// operators, each with one person per role, all with the same demo password (README "Demo sign-ins").
// Other domains' seeders find these organisations by name.
import { hashPasswordOutsideNitro } from '../../accounts/password-hash'
import { memberships, organisations, users, type OrganisationKind, type Role } from '../schema'
import type { Database } from '../index'
import type { Seeder } from './index'

export const DEMO_PASSWORD = 'stormledger-demo-2026'

interface DemoOrganisation {
  name: string
  kind: OrganisationKind
  currency: string
  domain: string
  people: Record<Role, string>
}

export const DEMO_ORGANISATIONS: DemoOrganisation[] = [
  {
    name: 'Cobalt Ridge Assurance', kind: 'insurer', currency: 'USD', domain: 'cobaltridge.example',
    people: { admin: 'Marguerite Olsted', analyst: 'Tobias Wrenfield', underwriter: 'Ines Calloway', asset_manager: 'Dorian Pettigrew', viewer: 'Hollis Marchetti' },
  },
  {
    name: 'Quillfeather Brokerage', kind: 'broker', currency: 'USD', domain: 'quillfeather.example',
    people: { admin: 'Saskia Brennholt', analyst: 'Emeric Fairlow', underwriter: 'Juniper Ashgrove', asset_manager: 'Caspian Delacorte', viewer: 'Rosalind Thackery' },
  },
  {
    name: 'Dunmere Basin Operating', kind: 'operator', currency: 'USD', domain: 'dunmere.example',
    people: { admin: 'Augustin Halloway', analyst: 'Priya Vantongeren', underwriter: 'Lorcan Ebbesen', asset_manager: 'Wilhelmina Strand', viewer: 'Osric Penhallow' },
  },
  {
    name: 'Sablefork Petroleum', kind: 'operator', currency: 'USD', domain: 'sablefork.example',
    people: { admin: 'Theodora Quenby', analyst: 'Malachy Osterberg', underwriter: 'Esme Harcastle', asset_manager: 'Benedikt Ravensworth', viewer: 'Clementine Avery' },
  },
]

const ROLE_ORDER: Role[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']

/** analyst@cobaltridge.example, asset.manager@sablefork.example, … */
export function demoEmail(role: Role, domain: string): string {
  return `${role.replace('_', '.')}@${domain}`
}

export function demoSignInList() {
  return DEMO_ORGANISATIONS.flatMap(o => ROLE_ORDER.map(role => ({
    organisation: o.name, role: role.replace('_', ' '), email: demoEmail(role, o.domain), name: o.people[role], password: DEMO_PASSWORD,
  })))
}

export const accountsSeeder: Seeder = {
  name: 'accounts',
  async run(db: Database) {
    for (const o of DEMO_ORGANISATIONS) {
      const [organisation] = await db.insert(organisations).values({ name: o.name, kind: o.kind, currency: o.currency }).returning()
      for (const role of ROLE_ORDER) {
        const [user] = await db.insert(users).values({
          email: demoEmail(role, o.domain), name: o.people[role],
          passwordHash: await hashPasswordOutsideNitro(DEMO_PASSWORD), lastOrganisationId: organisation!.id,
        }).returning()
        await db.insert(memberships).values({ organisationId: organisation!.id, userId: user!.id, role })
      }
    }
  },
}
