// The demo scenario's sign-ins, printed by `npm start` (filled in by the accounts seeder).
export interface DemoSignIn { organisation: string, role: string, email: string, password: string }

export async function demoSignIns(): Promise<DemoSignIn[]> {
  return []
}
