import fc from 'fast-check'

/** Text a client should never send but a broken or hostile one may: control characters, odd Unicode, odd lengths. */
export const hostileString: fc.Arbitrary<string> = fc.oneof(
  fc.string(),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: fc.constantFrom('\u0000', '\u0001', '\u001f', '\u007f', '\t', '\n', 'a', '-', '%'), maxLength: 12 }),
  fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', 'valueOf'),
  fc.constantFrom('', ' ', '0', '-1', '1e309', 'NaN', 'null', 'true', '[]', '{}', "' OR 1=1 --", '"; DROP TABLE exams; --'),
  fc.constantFrom('0000-01-01T00:00:00Z', '0099-12-31T23:59:59Z', '9999-12-31T23:59:59Z', '2026-02-30T00:00:00Z', '2026-12-01'),
  fc.constantFrom('\ud800', '\udfff', '\u202e', '\ufeff', '😀'.repeat(50), 'é'.repeat(300)),
  fc.uuid().map((id) => id.toUpperCase()),
  fc.nat({ max: 300_000 }).map((n) => 'x'.repeat(n)),
)

/** Objects whose keys hit prototype lookups or whose values break `String(value)`. */
export const prototypeObject: fc.Arbitrary<Record<string, unknown>> = fc.constantFrom(
  JSON.parse('{"__proto__": {"admin": true, "roles": ["admin"]}}'),
  { constructor: { prototype: { polluted: true } } },
  { toString: 1 },
  { valueOf: {} },
  { toString: 1, valueOf: 1 },
  { hasOwnProperty: 'x' },
)

/** A value nested `depth` levels deep, in arrays or objects. */
const nested = (depth: number, inArray: boolean): unknown => {
  let value: unknown = 'deep'
  for (let i = 0; i < depth; i++) value = inArray ? [value] : { a: value }
  return value
}

const numbers = fc.oneof(
  fc.double(),
  fc.integer(),
  fc.constantFrom(0, -0, -1, 1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, 2 ** 53, 5e-324, 0.1 + 0.2),
)

/** Any JSON value a hostile client may send in place of a field. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { arbitrary: hostileString, weight: 4 },
  { arbitrary: numbers, weight: 2 },
  { arbitrary: fc.constantFrom(null, true, false, [], {}), weight: 1 },
  { arbitrary: prototypeObject, weight: 2 },
  { arbitrary: fc.array(hostileString, { maxLength: 5 }), weight: 1 },
  { arbitrary: fc.array(prototypeObject, { maxLength: 3 }), weight: 1 },
  { arbitrary: fc.tuple(fc.integer({ min: 1, max: 3000 }), fc.boolean()).map(([d, a]) => nested(d, a)), weight: 1 },
  { arbitrary: fc.nat({ max: 5000 }).map((n) => Array.from({ length: n }, (_, i) => i)), weight: 1 },
  { arbitrary: fc.json({ maxDepth: 3 }).map((text) => JSON.parse(text) as unknown), weight: 1 },
)

/** A path parameter: a real id of the fixture, a UUID in either case, or hostile text; `raw` is put in the path unencoded. */
export const pathId = (realIds: string[]): fc.Arbitrary<{ raw: string } | { text: string }> =>
  fc.oneof(
    fc.constantFrom(...realIds).map((text) => ({ text })),
    fc.constantFrom(...realIds).map((text) => ({ text: text.toUpperCase() })),
    fc.uuid().map((text) => ({ text })),
    hostileString.map((text) => ({ text })),
    fc.constantFrom('%ff', '%', '%zz', '%e0%a4', '%00', '%2e%2e', '..', '%2F', 'a%0ab').map((raw) => ({ raw })),
  )
