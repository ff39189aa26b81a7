// Each server test file starts from an empty database (its own fixtures are made in the file).
import { beforeAll } from 'vitest'
import { testPool, truncateAll } from './db'

beforeAll(async () => {
  const pool = testPool()
  try {
    await truncateAll(pool)
  } finally {
    await pool.end()
  }
})
