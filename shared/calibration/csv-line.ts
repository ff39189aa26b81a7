// Splits one CSV line (RFC 4180 quoting: "a, b" and "" inside quotes) into trimmed cells.
export function splitCsvLine(line: string): string[] {
  if (!line.includes('"')) return line.split(',').map(c => c.trim())
  const cells: string[] = []
  let cell = ''
  let quoted = false
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') { cell += '"'; i++ }
      else if (ch === '"') quoted = false
      else cell += ch
    } else if (ch === '"') quoted = true
    else if (ch === ',') { cells.push(cell.trim()); cell = '' }
    else cell += ch
  }
  cells.push(cell.trim())
  return cells
}

/** Maps header names (case-insensitive, byte-order mark removed) to column positions, or lists what is wrong. */
export function readHeader<K extends string>(line: string, required: readonly K[], optional: readonly K[] = []): { columns: Record<K, number>, problems: string[] } {
  const names = splitCsvLine(line.replace(/^\uFEFF/, '')).map(n => n.toLowerCase())
  const columns = {} as Record<K, number>
  const problems: string[] = []
  const known = new Set<string>([...required, ...optional])
  for (const k of [...required, ...optional]) columns[k] = names.indexOf(k)
  const missing = required.filter(k => columns[k] < 0)
  const unknown = names.filter(n => n && !known.has(n))
  const duplicated = names.filter((n, i) => n && names.indexOf(n) !== i)
  if (missing.length) problems.push(`Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}.`)
  if (unknown.length) problems.push(`Unknown column${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}.`)
  if (duplicated.length) problems.push(`Repeated column${duplicated.length > 1 ? 's' : ''}: ${[...new Set(duplicated)].join(', ')}.`)
  if (problems.length) problems.push(`The first line must name the columns ${required.join(', ')}${optional.length ? ` (optionally ${optional.join(', ')})` : ''}.`)
  return { columns, problems }
}
