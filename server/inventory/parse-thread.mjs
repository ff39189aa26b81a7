// The worker-thread entry (piscina) for reading uploaded files off the web server's event loop.
// Plain JavaScript so that the web server (a Nitro bundle run by node) can start it from the
// source tree; it loads the TypeScript reader through tsx.
import { tsImport } from 'tsx/esm/api'

const reader = await tsImport('./parse-upload.ts', import.meta.url)

export default function parse(task) {
  return reader.parseUpload(task)
}
