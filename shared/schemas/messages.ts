// Validation messages in words, for the schemas' checks that carry no message of their own. Used
// per parse (`schema.safeParse(value, { error: inWords })`) by the server's body, query and
// parameter readers and by the forms, so a person reads what to fix, never a dump of the issue.
import type { z } from 'zod'

type RawIssue = z.core.$ZodRawIssue

/** "flashDensity" → "flash density"; a path → "tanks, row 3, height m". */
export function fieldLabel(path: readonly PropertyKey[] | undefined): string {
  const parts = (path ?? []).map(p => (typeof p === 'number' ? `item ${p + 1}` : String(p).replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/[_-]+/g, ' ').toLowerCase()))
  return parts.join(', ')
}

const KIND: Record<string, string> = {
  string: 'text', number: 'a number', int: 'a whole number', boolean: 'yes or no (true or false)', object: 'a group of fields',
  array: 'a list', bigint: 'a whole number', date: 'a date', null: 'empty', undefined: 'left out',
}

function limitText(iss: { origin?: string, maximum?: unknown, minimum?: unknown, inclusive?: boolean }, side: 'max' | 'min'): string {
  const bound = Number(side === 'max' ? iss.maximum : iss.minimum)
  const shown = Number.isFinite(bound) ? bound.toLocaleString('en-GB') : String(side === 'max' ? iss.maximum : iss.minimum)
  const strict = iss.inclusive === false
  if (iss.origin === 'string') return side === 'max' ? `use at most ${shown} characters` : (bound <= 1 ? 'fill it in' : `use at least ${shown} characters`)
  if (iss.origin === 'array' || iss.origin === 'set') return side === 'max' ? `give at most ${shown} items` : `give at least ${shown} item${bound === 1 ? '' : 's'}`
  if (side === 'max') return strict ? `enter a number below ${shown}` : `enter a number of at most ${shown}`
  return strict ? `enter a number above ${shown}` : `enter a number of at least ${shown}`
}

function sentence(label: string, what: string): string {
  const text = label ? `${label}: ${what}.` : `${what}.`
  return text[0]!.toUpperCase() + text.slice(1)
}

/** A zod error map: a sentence naming the field and what to enter. */
export function inWords(iss: RawIssue): string {
  const label = fieldLabel(iss.path)
  switch (iss.code) {
    case 'invalid_type': {
      if (iss.input === undefined) return sentence(label, 'this is required')
      const expected = KIND[iss.expected] ?? iss.expected
      return sentence(label, `enter ${expected}`)
    }
    case 'too_big': return sentence(label, limitText(iss, 'max'))
    case 'too_small': return sentence(label, limitText(iss, 'min'))
    case 'invalid_format': {
      const format = iss.format === 'regex' ? 'the expected form' : iss.format === 'uuid' || iss.format === 'guid' ? 'a valid identifier' : `a valid ${iss.format}`
      return sentence(label, `enter ${format}`)
    }
    case 'invalid_value': return sentence(label, `choose one of ${iss.values.map(v => String(v)).join(', ')}`)
    case 'not_multiple_of': return sentence(label, `enter a multiple of ${String(iss.divisor)}`)
    case 'unrecognized_keys': return sentence(label, `remove the unknown field${iss.keys.length === 1 ? '' : 's'} ${iss.keys.join(', ')}`)
    case 'invalid_union': return sentence(label, 'this value is not one of the accepted kinds')
    case 'invalid_key':
    case 'invalid_element': return sentence(label, 'an entry in this list or map is not valid')
    default: return sentence(label, 'this value is not valid')
  }
}

/** Field messages by dotted path ("tanks.2.heightM"; "" for the whole value). */
export type FieldMessages = Record<string, string>

/** The first message per field of a failed parse, keyed by `path.join('.')`: the one conversion, used by the server's answers, the forms and the engine's errors. */
export function fieldMessages(issues: readonly { path: readonly PropertyKey[], message: string }[]): FieldMessages {
  const fields: FieldMessages = {}
  for (const issue of issues) fields[issue.path.map(String).join('.')] ??= issue.message
  return fields
}
