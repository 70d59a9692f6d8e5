const FIELD = '\x1f'
const FIELD_CODE = 31
const RECORD_CODE = 30
const ZERO = 48
const NINE = 57
const MINUS = 45
const POINT = 46
// Up to 15 significant digits the mantissa is an exact integer and m / 10^k rounds exactly as Number() would.
const EXACT_DIGITS = 15
const POWERS_OF_TEN = Array.from({ length: EXACT_DIGITS + 1 }, (_, k) => 10 ** k)

/**
 * Reads a string packed as fields separated by U+001F and records by U+001E, in place: splitting a multi-megabyte
 * string into a string per field costs more than the query that built it.
 */
export class PackedScanner {
  private readonly packed: string
  private i = 0

  constructor(packed: string) {
    this.packed = packed
  }

  get done(): boolean {
    return this.i >= this.packed.length
  }

  /** A text field that is not the last of its record. */
  text(): string {
    const end = this.packed.indexOf(FIELD, this.i)
    const value = this.packed.slice(this.i, end)
    this.i = end + 1
    return value
  }

  /** A number as SQLite writes a REAL or INTEGER; other forms (exponents, long mantissas) go through Number(). */
  number(): number {
    const text = this.packed
    const start = this.i
    const negative = text.charCodeAt(start) === MINUS
    let i = negative ? start + 1 : start
    let mantissa = 0
    let digits = 0
    let decimals = -1
    for (let c = text.charCodeAt(i); c !== FIELD_CODE && c !== RECORD_CODE && i < text.length; c = text.charCodeAt(++i)) {
      if (c >= ZERO && c <= NINE) {
        mantissa = mantissa * 10 + (c - ZERO)
        digits += 1
        if (decimals >= 0) decimals += 1
      } else if (c === POINT && decimals < 0) decimals = 0
      else digits = Infinity
    }
    this.i = i + 1
    if (digits > EXACT_DIGITS || digits === 0) return Number(text.slice(start, i))
    const value = decimals > 0 ? mantissa / POWERS_OF_TEN[decimals]! : mantissa
    return negative ? -value : value
  }
}
