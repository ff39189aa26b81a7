import { describe, expect, inject, it } from 'vitest'
import { parameterRows, engineVersion } from '../../server/methodology/engine-facts'

describe('GET /api/methodology', () => {
  it('answers without sign-in with the rendered document, one table row per assumption and the engine version', async () => {
    const res = await fetch(`${inject('baseUrl')}/api/methodology`)
    expect(res.status).toBe(200)
    const body = await res.json() as { html: string, engineVersion: string }
    expect(body.engineVersion).toBe(engineVersion)
    // The document's own title (docs/methodology.md) rendered as HTML.
    expect(body.html).toContain('<h1>How Stormledger estimates lightning-ignition risk</h1>')
    const tableRows = body.html.split('<div class="methodology-table">')[1]!.split('</table>')[0]!.match(/<tr>/g)!.length
    // Header row + one row per parameter of the engine's metadata.
    expect(tableRows).toBe(parameterRows.length + 1)
  })
})
