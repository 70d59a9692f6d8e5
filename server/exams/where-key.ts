/**
 * A where clause (or any plain value) as text that is equal exactly when the clause is: keys sorted, and Sequelize's
 * operator symbols (`Op.or`, `Op.in`) written by name, which JSON.stringify would silently drop.
 */
export function whereKey(value: unknown): string {
  return JSON.stringify(walk(value))
}

function walk(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(walk)
  if (value instanceof Date) return value.toISOString()
  if (!value || typeof value !== 'object') return value
  const object = value as Record<string | symbol, unknown>
  const named: [string, unknown][] = [
    ...Object.keys(object).map((k): [string, unknown] => [k, object[k]]),
    ...Object.getOwnPropertySymbols(object).map((s): [string, unknown] => [`$${s.description ?? ''}`, object[s]]),
  ]
  return Object.fromEntries(named.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([k, v]) => [k, walk(v)]))
}
