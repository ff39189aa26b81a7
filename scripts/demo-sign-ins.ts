// The demo scenario's sign-ins, printed by `npm start` — only when the demo was seeded into this database.
import { isDemoSeeded } from '../server/db/seed/index'
import { demoSignInList } from '../server/db/seed/accounts'

export interface DemoSignIn { organisation: string, role: string, email: string, password: string }

export async function demoSignIns(): Promise<DemoSignIn[]> {
  if (!(await isDemoSeeded().catch(() => false))) return []
  return demoSignInList()
}
