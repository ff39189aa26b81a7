// zod compiles fast parsers with `new Function` when it may; under the app's Content Security Policy
// (no 'unsafe-eval') even its probe shows as a CSP violation. Jitless mode skips the probe. Named
// 00.… so it runs before any schema is built on the client.
import { z } from 'zod'

z.config({ jitless: true })

export default defineNuxtPlugin(() => {})
