import { Op, type Sequelize, type Transaction, type WhereOptions } from 'sequelize'
import { AgreementPairModel } from '../models/index.ts'
import { examPairOf, type PairRow } from './pair-rows.ts'
import type { ExamPair } from './pairs.ts'

interface Copy {
  /** The last change this copy has read. */
  generation: number
  byCode: Map<string, ExamPair[]>
  all: readonly ExamPair[] | null
}

interface Mirror {
  generation: number
  /** Patient codes whose pairs changed, by generation; null: every code. */
  changes: { generation: number; codes: readonly string[] | null }[]
  copy: Promise<Copy | undefined>
}

const KEPT_CHANGES = 1_000
const MAX_CHANGED_CODES = 1_000
const CODES_PER_QUERY = 500
// Derivable from these, so not read: pairedAt, meanInclinationDeg, inclinationBand.
const ATTRIBUTES: (keyof PairRow)[] = [
  'earlierExamId', 'laterExamId', 'patientCode', 'earlierExaminerId', 'laterExaminerId', 'earlierTeamId', 'laterTeamId',
  'earlierExaminedAt', 'laterExaminedAt', 'earlierHeightCm', 'laterHeightCm', 'earlierCvpCmH2O', 'laterCvpCmH2O',
  'earlierInclinationDeg', 'laterInclinationDeg', 'earlierVein', 'laterVein', 'earlierColumnTop', 'laterColumnTop',
]
const mirrors = new WeakMap<Sequelize, Mirror>()

function mirrorOf(sequelize: Sequelize): Mirror {
  let mirror = mirrors.get(sequelize)
  if (!mirror) mirrors.set(sequelize, (mirror = { generation: 0, changes: [], copy: Promise.resolve(undefined) }))
  return mirror
}

/** Tells the copy, once the transaction has committed, which patient codes to read again (null: all of them). */
export function notePairChanges(sequelize: Sequelize, transaction: Transaction, codes: readonly string[] | null): void {
  transaction.afterCommit(() => {
    const mirror = mirrorOf(sequelize)
    mirror.changes.push({ generation: ++mirror.generation, codes })
    if (mirror.changes.length > KEPT_CHANGES) mirror.changes.shift()
  })
}

async function read(where: WhereOptions<PairRow>, byCode: Map<string, ExamPair[]>): Promise<void> {
  const rows = await AgreementPairModel.findAll({ attributes: ATTRIBUTES, where, raw: true })
  for (const row of rows) {
    const pair = examPairOf(row)
    const pairs = byCode.get(pair.earlier.patientCode)
    if (pairs) pairs.push(pair)
    else byCode.set(pair.earlier.patientCode, [pair])
  }
}

/** The codes changed since `copy` was read; null when reading everything is simpler or the log no longer reaches back. */
function changedSince(mirror: Mirror, copy: Copy): Set<string> | null {
  const oldest = mirror.changes[0]?.generation ?? mirror.generation + 1
  if (copy.generation < oldest - 1) return null
  const codes = new Set<string>()
  for (const change of mirror.changes) {
    if (change.generation <= copy.generation) continue
    if (!change.codes) return null
    for (const code of change.codes) codes.add(code)
  }
  return codes.size > MAX_CHANGED_CODES ? null : codes
}

async function refresh(mirror: Mirror, copy: Copy | undefined): Promise<Copy> {
  if (copy?.generation === mirror.generation) return copy
  // Taken before reading: a change committed meanwhile is read again next time, which does no harm.
  const generation = mirror.generation
  const codes = copy && changedSince(mirror, copy)
  if (!copy || !codes) {
    const byCode = new Map<string, ExamPair[]>()
    await read({}, byCode)
    return { generation, byCode, all: null }
  }
  const list = [...codes]
  for (const code of list) copy.byCode.delete(code)
  for (let i = 0; i < list.length; i += CODES_PER_QUERY)
    await read({ patientCode: { [Op.in]: list.slice(i, i + CODES_PER_QUERY) } }, copy.byCode)
  return { generation, byCode: copy.byCode, all: null }
}

/**
 * Every stored pair, earlier exam first. Dashboards ask again and again with other filters, so the table is read once
 * per process and then only the patient codes that writes in this process have derived again since (see
 * `notePairChanges`); calls queue behind one another, so concurrent ones read once. A request keeps the array it got.
 */
export async function mirroredPairs(): Promise<readonly ExamPair[]> {
  const mirror = mirrorOf(AgreementPairModel.sequelize!)
  const next = mirror.copy.catch(() => undefined).then((copy) => refresh(mirror, copy))
  mirror.copy = next
  const copy = await next
  return (copy.all ??= [...copy.byCode.values()].flat())
}
