// GET /api/methodology — the methodology (docs/methodology.md) as HTML with the assumption table
// generated from the engine's metadata and the engine version. Public: no sign-in needed.
import { renderMethodology } from '../methodology/render'
import { engineVersion, parameterRows } from '../methodology/engine-facts'

let cached: { html: string, engineVersion: string } | null = null

export default defineEventHandler(async () => {
  if (!cached) {
    const markdown = await useStorage('assets:docs').getItem('methodology.md')
    if (typeof markdown !== 'string' || markdown.length === 0) {
      throw createError({ statusCode: 500, statusMessage: 'The methodology document is missing from this build.' })
    }
    cached = { html: renderMethodology(markdown, parameterRows, engineVersion), engineVersion }
  }
  return cached
})
