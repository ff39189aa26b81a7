// Role matrix rules for the methodology: public reading, no sign-in.
import type { MatrixModule } from './types'

export const rules: MatrixModule['rules'] = [
  { method: 'GET', file: 'server/api/methodology.get.ts', path: '/api/methodology', allowed: 'public' },
]
