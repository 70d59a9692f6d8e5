import { literal, type Sequelize } from 'sequelize'
import { quoteName } from './quote.ts'

/** `%`, `_` and the escape character itself, each escaped with `!` so the needle matches as plain text. */
function likePattern(text: string): string {
  return `%${text.toLowerCase().replace(/[!%_]/g, (c) => `!${c}`)}%`
}

/**
 * A condition: the column contains the text anywhere, without case. LOWER … LIKE … ESCAPE is standard SQL and reads
 * the same on SQLite and PostgreSQL (whose LIKE has a default escape and is case-sensitive, hence LOWER on both sides).
 */
export function containsText(sequelize: Sequelize, column: string, text: string) {
  return literal(`LOWER(${quoteName(column)}) LIKE ${sequelize.escape(likePattern(text))} ESCAPE '!'`)
}
