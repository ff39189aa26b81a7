// Line-by-line reading of a byte stream (request body or stored file), never the whole file at once.
import { StringDecoder } from 'node:string_decoder'

/** Yields each line (without its \n or \r\n) as chunks arrive; memory is bounded by the longest line. */
export async function* readLines(source: AsyncIterable<Buffer | string>, maxLineLength = 64 * 1024): AsyncGenerator<string> {
  const decoder = new StringDecoder('utf8')
  let pending = ''
  for await (const chunk of source) {
    pending += typeof chunk === 'string' ? chunk : decoder.write(chunk)
    let start = 0
    let nl: number
    while ((nl = pending.indexOf('\n', start)) >= 0) {
      if (nl - start > maxLineLength) throw new LineTooLongError(maxLineLength)
      yield stripCr(pending.slice(start, nl))
      start = nl + 1
    }
    pending = pending.slice(start)
    if (pending.length > maxLineLength) throw new LineTooLongError(maxLineLength)
  }
  pending += decoder.end()
  if (pending.length > maxLineLength) throw new LineTooLongError(maxLineLength)
  if (pending.length > 0) yield stripCr(pending)
}

export class LineTooLongError extends Error {
  constructor(limit: number) {
    super(`A line is longer than ${Math.round(limit / 1024)} kB: this does not look like a CSV file of records.`)
  }
}

const stripCr = (line: string) => (line.endsWith('\r') ? line.slice(0, -1) : line)
