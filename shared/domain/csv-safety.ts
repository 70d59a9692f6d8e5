/**
 * Cells a spreadsheet would run as a formula start with = + - @, a tab or a carriage return (OWASP, "CSV Injection");
 * papaparse prefixes them with an apostrophe when given this pattern as `escapeFormulae`. Its own pattern for
 * `escapeFormulae: true` ends in `.*$`, which misses a cell whose first line is a formula and that goes on after a line
 * break, so the pattern is only the first character. Numbers are left alone (papaparse never escapes a number), so
 * −2.5 stays a number.
 */
export const FORMULA_START = /^[=+\-@\t\r]/
