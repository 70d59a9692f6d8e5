import { StatsInputError } from './result.ts'

/** Throws unless every value is a finite number. */
export function assertFinite(values: readonly number[], name: string): void {
  const bad = values.findIndex((v) => typeof v !== 'number' || !Number.isFinite(v))
  if (bad >= 0) throw new StatsInputError(`${name}[${bad}] must be a finite number, got ${String(values[bad])}`)
}

/** Throws unless every row has the same length; returns that length (0 for no rows). */
export function assertRectangular(matrix: readonly (readonly number[])[], name: string): number {
  const width = matrix[0]?.length ?? 0
  const ragged = matrix.findIndex((row) => row.length !== width)
  if (ragged >= 0) {
    throw new StatsInputError(`${name} is ragged: row ${ragged} has ${matrix[ragged]!.length} entries, row 0 has ${width}`)
  }
  matrix.forEach((row, i) => assertFinite(row, `${name}[${i}]`))
  return width
}

/** Throws unless the matrix is rectangular and holds only non-negative whole counts; returns its width. */
export function assertCounts(matrix: readonly (readonly number[])[], name: string): number {
  const width = assertRectangular(matrix, name)
  matrix.forEach((row, i) =>
    row.forEach((v, j) => {
      if (v < 0 || !Number.isInteger(v)) {
        throw new StatsInputError(`${name}[${i}][${j}] must be a non-negative whole count, got ${v}`)
      }
    }),
  )
  return width
}

/** Throws unless the table is a square matrix of counts; returns its dimension. */
export function assertSquareCounts(table: readonly (readonly number[])[], name: string): number {
  const width = assertCounts(table, name)
  if (table.length > 0 && width !== table.length) {
    throw new StatsInputError(`${name} must be square (k×k), got ${table.length}×${width}`)
  }
  return table.length
}

/** Sum of an array. */
export function sum(values: readonly number[]): number {
  return values.reduce((acc, v) => acc + v, 0)
}
