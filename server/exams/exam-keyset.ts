import { literal, type Sequelize } from 'sequelize'
import { z } from 'zod'
import { ExamSortSchema, type ExamListQuery } from '#shared/schemas/exam'
import { invalidInput } from '../errors.ts'
import type { ExamModel } from '../models/index.ts'
import { quoteName } from '../db/quote.ts'

type Sort = ExamListQuery['sort']
type Order = ExamListQuery['order']

const COLUMNS: Record<Sort, string> = {
  examinedAt: 'examinedAt',
  patientCode: 'patientCode',
  status: 'status',
  heightCm: 'verticalHeightCm',
  cvpCmH2O: 'cvpCmH2O',
  updatedAt: 'updatedAt',
}
const DATES = new Set<Sort>(['examinedAt', 'updatedAt'])
// Not-assessable exams have no height or CVP: they sort as the lowest values (where SQLite puts NULL), and the keyset
// compares the same expression, as a comparison with NULL is never true. The list-indexes migration indexes it as is.
const LOWEST = '-1e308'
const NULLABLE = new Set<Sort>(['heightCm', 'cvpCmH2O'])

/** The sort expression of a column, as ORDER BY and the keyset comparison both use it. */
export function sortExpression(sort: Sort): string {
  const column = quoteName(COLUMNS[sort])
  return NULLABLE.has(sort) ? `COALESCE(${column}, ${LOWEST})` : column
}

/** What a cursor carries: the sort it was made under, the last row's sort value and id, and the count of the first page. */
const CursorSchema = z.object({
  s: ExamSortSchema,
  o: z.enum(['asc', 'desc']),
  v: z.union([z.string(), z.number(), z.null()]),
  i: z.string(),
  t: z.number().int().min(0),
  c: z.boolean(),
})
export type Cursor = z.infer<typeof CursorSchema>

const badCursor = () => invalidInput({ cursor: 'This cursor is not from this list; start again from the first page' })

/** A cursor as the client holds it: opaque URL-safe text. */
export function encodeCursor(cursor: object): string {
  return Buffer.from(JSON.stringify(cursor)).toString('base64url')
}

/** What a cursor holds, or null when the text is not one; the caller checks its shape. */
export function readCursor(text: string): unknown {
  try {
    return JSON.parse(Buffer.from(text, 'base64url').toString('utf8'))
  } catch {
    return null
  }
}

/** The cursor sent back, checked against the sort asked for: a cursor only continues the order it came from. */
export function decodeCursor(text: string, sort: Sort, order: Order): Cursor {
  const cursor = CursorSchema.safeParse(readCursor(text))
  if (!cursor.success || cursor.data.s !== sort || cursor.data.o !== order) throw badCursor()
  return cursor.data
}

/** The cursor after this row: its sort value as stored (a date as ISO text) and its id. */
export function cursorAfter(row: ExamModel, query: Pick<ExamListQuery, 'sort' | 'order'>, total: number, capped: boolean): string {
  const raw = row.get(COLUMNS[query.sort]) as Date | string | number | null
  const v = raw instanceof Date ? raw.toISOString() : NULLABLE.has(query.sort) && raw === null ? null : raw
  return encodeCursor({ s: query.sort, o: query.order, v, i: row.id, t: total, c: capped } satisfies Cursor)
}

/**
 * Rows strictly after the cursor in (sort, id) order, as one range of the composite index however deep: a row-value
 * comparison for a column; for the height and CVP expressions, which SQLite does not range over in a row value, a
 * range on the expression narrowed by the tie-break.
 */
export function afterCursor(sequelize: Sequelize, cursor: Cursor) {
  const value = cursor.v === null ? LOWEST : sequelize.escape(DATES.has(cursor.s) ? new Date(String(cursor.v)) : cursor.v)
  const [key, op, id] = [sortExpression(cursor.s), cursor.o === 'asc' ? '>' : '<', sequelize.escape(cursor.i)]
  if (!NULLABLE.has(cursor.s)) return literal(`(${key}, "id") ${op} (${value}, ${id})`)
  return literal(`(${key} ${op}= ${value} AND (${key} ${op} ${value} OR "id" ${op} ${id}))`)
}

/** ORDER BY for the log: the sort, then id in the same direction, so the index serves both. */
export function orderOf(query: Pick<ExamListQuery, 'sort' | 'order'>): [ReturnType<typeof literal>, string][] {
  const direction = query.order.toUpperCase()
  return [
    [literal(sortExpression(query.sort)), direction],
    [literal('"id"'), direction],
  ]
}
