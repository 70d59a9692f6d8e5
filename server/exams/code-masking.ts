const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/**
 * Replaces every occurrence of the given patient codes (any case) with their pseudonyms, in strings at any depth:
 * a code can sit in a `patientCode` field and in free text such as notes or a return comment.
 */
export function maskCodes<T>(value: T, codes: Iterable<string>, mask: (code: string) => string): T {
  const known = [...new Set([...codes].map((c) => c.trim()).filter(Boolean))].sort((a, b) => b.length - a.length)
  if (!known.length) return value
  const pattern = new RegExp(known.map(escape).join('|'), 'gi')
  const byLower = new Map(known.map((c) => [c.toLowerCase(), c]))
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return v.replace(pattern, (hit) => mask(byLower.get(hit.toLowerCase()) ?? hit))
    if (Array.isArray(v)) return v.map(walk)
    if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]))
    return v
  }
  return walk(value) as T
}
