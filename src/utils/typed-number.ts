/** What a typed number field holds: a number, nothing yet, or text that is not a number (with the message to show). */
export type TypedNumber = { value: number | null; error: null } | { value: null; error: string }

const UNREADABLE = 'Type a number such as 2.5 (digits and one decimal point or comma)'

// A sign, digits, at most one decimal separator: "2,5", "2.5", "-1", ",5", "4." — nothing that could hide a tenfold value.
const NUMBER = /^[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)$/
// What a person has typed on the way to a number: nothing to complain about yet, and nothing to record either.
const UNFINISHED = /^[+-]?[.,]?$/

/**
 * Reads a number the way people type it: a decimal comma is a decimal point ("2,5" is 2.5, never 25); spaces around
 * it, a typographic minus and a leading plus are accepted; anything else (a second separator, letters, an exponent) is
 * refused with a message rather than guessed, as is a space inside ("2 5" is not 25).
 */
export function readTypedNumber(text: string): TypedNumber {
  const compact = text.trim().replace(/^[\u2212\u2013]/, '-')
  if (UNFINISHED.test(compact)) return { value: null, error: null }
  if (!NUMBER.test(compact)) return { value: null, error: UNREADABLE }
  return { value: Number(compact.replace(',', '.')), error: null }
}
