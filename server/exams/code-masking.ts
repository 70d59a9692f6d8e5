const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/** Fields typed freely by people: they can name any patient, so a reader who sees codes masked never reads them. */
export const FREE_TEXT_KEYS: ReadonlySet<string> = new Set(['notes', 'notAssessableText', 'returnComment', 'comment'])

/** What a masked reader reads in place of free text. */
export const WITHHELD_TEXT = '(free text withheld)'

/**
 * Replaces every occurrence of the given patient codes (any case) with their pseudonyms, in strings at any depth:
 * a code can sit in a `patientCode` field or a round's name. Text under a free-text key (`notes`, a return comment)
 * is withheld whole, as it can name other patients than the ones known here.
 */
export function maskCodes<T>(value: T, codes: Iterable<string>, mask: (code: string) => string): T {
  const known = [...new Set([...codes].map((c) => c.trim()).filter(Boolean))].sort((a, b) => b.length - a.length)
  const pattern = known.length ? new RegExp(known.map(escape).join('|'), 'gi') : null
  const byLower = new Map(known.map((c) => [c.toLowerCase(), c]))
  const text = (v: string, withheld: boolean) => {
    if (withheld) return v ? WITHHELD_TEXT : v
    return pattern ? v.replace(pattern, (hit) => mask(byLower.get(hit.toLowerCase()) ?? hit)) : v
  }
  const walk = (v: unknown, withheld: boolean): unknown => {
    if (typeof v === 'string') return text(v, withheld)
    if (Array.isArray(v)) return v.map((x) => walk(x, withheld))
    if (v && typeof v === 'object')
      return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x, withheld || FREE_TEXT_KEYS.has(k))]))
    return v
  }
  return walk(value, false) as T
}
