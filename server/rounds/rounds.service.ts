import { randomUUID } from 'node:crypto'
import { Op, type Transaction, type WhereOptions } from 'sequelize'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { RoundCreate, RoundDetail, RoundEntry, RoundPerson, RoundResults, RoundSummary } from '#shared/schemas/round'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import { AppError, invalidInput } from '../errors.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { ExamModel, RoundExaminerModel, RoundModel, RoundPatientCodeModel, UserModel } from '../models/index.ts'
import { currentSettings } from '../settings/settings.service.ts'
import { rolesOf } from '../users/users.service.ts'
import { codePresenter, examIdsShown, type CodePresenter, type RoundViewer } from './round-presentation.ts'
import { cellKey, roundStatistics, type RoundReadings } from './round-results.ts'

/** A round with its patient codes and examiners in the order the educator gave them. */
interface LoadedRound {
  round: RoundModel
  patientCodes: string[]
  examiners: RoundPerson[]
  creator: RoundPerson
}

/** The latest submitted exam and the latest draft of each (examiner, patient code) cell. */
interface Cells {
  recorded: Map<string, ExamModel>
  drafts: Map<string, ExamModel>
}

const roundNotFound = () => new AppError('round-not-found', 404, 'No such calibration round')

function inTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return writeTransaction(RoundModel.sequelize!, work)
}

async function peopleById(ids: readonly string[]): Promise<Map<string, UserModel>> {
  const users = await UserModel.findAll({ where: { id: { [Op.in]: [...new Set(ids)] } } })
  return new Map(users.map((u) => [u.id, u]))
}

async function loadRounds(rounds: RoundModel[]): Promise<LoadedRound[]> {
  if (!rounds.length) return []
  const ids = rounds.map((r) => r.id)
  const [codes, examiners] = await Promise.all([
    RoundPatientCodeModel.findAll({ where: { roundId: { [Op.in]: ids } }, order: [['position', 'ASC']] }),
    RoundExaminerModel.findAll({ where: { roundId: { [Op.in]: ids } }, order: [['position', 'ASC']] }),
  ])
  const people = await peopleById([...rounds.map((r) => r.createdBy), ...examiners.map((e) => e.examinerId)])
  const person = (id: string): RoundPerson => ({ id, displayName: people.get(id)?.displayName ?? '' })
  return rounds.map((round) => ({
    round,
    patientCodes: codes.filter((c) => c.roundId === round.id).map((c) => c.patientCode),
    examiners: examiners.filter((e) => e.roundId === round.id).map((e) => person(e.examinerId)),
    creator: person(round.createdBy),
  }))
}

/** The round if the user takes part in it (its educator or one of its examiners); 404 otherwise, so existence is not disclosed. */
async function visibleRound(user: User, id: string): Promise<LoadedRound> {
  const round = await RoundModel.findByPk(id)
  if (!round) throw roundNotFound()
  const [loaded] = await loadRounds([round])
  if (!isCreator(user, loaded!) && !isExaminer(user, loaded!)) throw roundNotFound()
  return loaded!
}

const isCreator = (user: User, { round }: LoadedRound) => round.createdBy === user.id && user.roles.includes('educator')
const isExaminer = (user: User, { examiners }: LoadedRound) => examiners.some((e) => e.id === user.id)
/** The round's codes as this viewer sees them: real for its examiners, pseudonyms for everyone else. */
const presenterFor = (viewer: RoundViewer, loaded: LoadedRound) => codePresenter(viewer, loaded.patientCodes, isExaminer(viewer.user, loaded))

/** The round's exams by cell: the latest by time of exam (then by last change) wins. */
async function cellsOf(loaded: LoadedRound): Promise<Cells> {
  const rows = await ExamModel.findAll({
    where: {
      roundId: loaded.round.id,
      examinerId: { [Op.in]: loaded.examiners.map((e) => e.id) },
      patientCode: { [Op.in]: loaded.patientCodes },
    },
    order: [
      ['examinedAt', 'DESC'],
      ['updatedAt', 'DESC'],
      ['id', 'ASC'],
    ],
  })
  const recorded = new Map<string, ExamModel>()
  const drafts = new Map<string, ExamModel>()
  for (const row of rows) {
    const cells = row.status === 'draft' ? drafts : recorded
    const key = cellKey(row.examinerId, row.patientCode)
    if (!cells.has(key)) cells.set(key, row)
  }
  return { recorded, drafts }
}

/** The height ICC and kappa use: h above the sternal angle of an exam whose column top was seen (as agreement pairs do). */
const measuredHeight = (row: ExamModel): number | null => (row.columnTop === 'seen' ? row.verticalHeightCm : null)

function summaryOf(loaded: LoadedRound, recorded: number, codes: CodePresenter): RoundSummary {
  const { round, patientCodes, examiners, creator } = loaded
  return {
    id: round.id,
    name: codes.text(round.name),
    status: round.status === 'closed' ? 'closed' : 'open',
    createdBy: creator,
    createdAt: round.createdAt.toISOString(),
    closedAt: round.closedAt?.toISOString() ?? null,
    patientCodes: patientCodes.map(codes.code),
    examiners,
    recorded,
    expected: patientCodes.length * examiners.length,
    codesMasked: codes.masked,
  }
}

/** Examiners must exist, be active and record exams (residents and attendings); field errors keyed `examinerIds.<i>`. */
async function checkExaminers(examinerIds: readonly string[]): Promise<void> {
  const people = await peopleById(examinerIds)
  const fields: Record<string, string> = {}
  examinerIds.forEach((id, i) => {
    const user = people.get(id)
    if (!user?.active) fields[`examinerIds.${i}`] = 'No such active account'
    else if (!rolesOf(user).some((r) => r === 'resident' || r === 'attending'))
      fields[`examinerIds.${i}`] = `${user.displayName} does not record exams: choose residents or attendings`
  })
  if (Object.keys(fields).length) throw invalidInput(fields)
}

/**
 * A new open round by the signed-in educator, audited as `round-create`. Answers its id only: the educator typed the
 * codes, but reads the round back (`getRound`) with them masked like everyone outside its examiners.
 */
export async function createRound(educator: User, input: RoundCreate): Promise<{ id: string }> {
  await checkExaminers(input.examinerIds)
  const id = randomUUID()
  await inTransaction(async (transaction) => {
    await RoundModel.create({ id, name: input.name, createdBy: educator.id, status: 'open', closedAt: null }, { transaction })
    await RoundPatientCodeModel.bulkCreate(
      input.patientCodes.map((patientCode, position) => ({ roundId: id, patientCode, position })),
      { transaction },
    )
    await RoundExaminerModel.bulkCreate(
      input.examinerIds.map((examinerId, position) => ({ roundId: id, examinerId, position })),
      { transaction },
    )
    const changes = {
      name: { from: null, to: input.name },
      status: { from: null, to: 'open' },
      patientCodes: { from: null, to: input.patientCodes },
      examinerIds: { from: null, to: input.examinerIds },
    }
    await audit({ actorId: educator.id, action: 'round-create', entityType: 'round', entityId: id, changes }, { transaction })
  })
  return { id }
}

/** Educators see the rounds they created; residents and attendings the rounds they examine in. Open rounds first, newest first. */
export async function listRounds(viewer: RoundViewer): Promise<RoundSummary[]> {
  const { user } = viewer
  const examinerOf = await RoundExaminerModel.findAll({ attributes: ['roundId'], where: { examinerId: user.id }, raw: true })
  const mine: WhereOptions<RoundModel>[] = [{ id: { [Op.in]: examinerOf.map((e) => e.roundId) } }]
  if (user.roles.includes('educator')) mine.push({ createdBy: user.id })
  const rounds = await RoundModel.findAll({
    where: { [Op.or]: mine },
    order: [
      ['status', 'DESC'],
      ['createdAt', 'DESC'],
      ['id', 'ASC'],
    ],
  })
  const loaded = await loadRounds(rounds)
  const counts = await recordedCounts(loaded)
  return loaded.map((l) => summaryOf(l, counts.get(l.round.id) ?? 0, presenterFor(viewer, l)))
}

/** How many cells of each round hold a submitted exam. */
async function recordedCounts(rounds: LoadedRound[]): Promise<Map<string, number>> {
  if (!rounds.length) return new Map()
  const rows = await ExamModel.findAll({
    attributes: ['roundId', 'examinerId', 'patientCode'],
    where: { roundId: { [Op.in]: rounds.map((r) => r.round.id) }, status: { [Op.ne]: 'draft' } },
    raw: true,
  })
  const counts = new Map<string, number>()
  for (const loaded of rounds) {
    const examiners = new Set(loaded.examiners.map((e) => e.id))
    const codes = new Set(loaded.patientCodes)
    const cells = new Set(
      rows.filter((r) => r.roundId === loaded.round.id && examiners.has(r.examinerId) && codes.has(r.patientCode)).map((r) => cellKey(r.examinerId, r.patientCode)),
    )
    counts.set(loaded.round.id, cells.size)
  }
  return counts
}

/**
 * The round with its progress grid. Values (exam id and height) are blinded while the round is open: each examiner
 * sees only their own, and the round's educator sees who has recorded which code but no values. After close, everyone
 * in the round sees them all. A draft shows only to its author. Codes as `presenterFor` shows them; an exam id only
 * where the viewer may read that exam with its code shown the same way (`examIdsShown`).
 */
export async function getRound(viewer: RoundViewer, id: string): Promise<RoundDetail> {
  const { user } = viewer
  const loaded = await visibleRound(user, id)
  const codes = presenterFor(viewer, loaded)
  const { recorded, drafts } = await cellsOf(loaded)
  const closed = loaded.round.status === 'closed'
  const cells = loaded.patientCodes.flatMap((patientCode) =>
    loaded.examiners.map((examiner) => {
      const key = cellKey(examiner.id, patientCode)
      const own = examiner.id === user.id
      const exam = recorded.get(key) ?? (own ? drafts.get(key) : undefined)
      const state: RoundEntry['state'] = recorded.has(key) ? 'recorded' : exam ? 'draft' : 'missing'
      return { examiner, patientCode, state, exam: exam && (own || closed) ? exam : undefined }
    }),
  )
  const readableIds = await examIdsShown(viewer, cells.flatMap((c) => (c.exam ? [c.exam.id] : [])), codes.masked)
  const entries: RoundEntry[] = cells.map(({ examiner, patientCode, state, exam }) => ({
    examinerId: examiner.id,
    patientCode: codes.code(patientCode),
    state,
    examId: exam && readableIds.has(exam.id) ? exam.id : null,
    heightCm: exam ? measuredHeight(exam) : null,
  }))
  return {
    ...summaryOf(loaded, recorded.size, codes),
    entries,
    canClose: !closed && isCreator(user, loaded),
    isExaminer: isExaminer(user, loaded),
  }
}

const closeListeners: (() => void)[] = []

/** Calls `listener` after each round closes, e.g. to drop what was computed from the closed rounds. */
export function onRoundClose(listener: () => void): void {
  closeListeners.push(listener)
}

/**
 * The heights of every complete subject (a patient code every examiner measured) of the rounds closed since `since`,
 * one row per subject in the round's examiner order; rows of different rounds may differ in length.
 */
export async function closedRoundSubjects(since: Date): Promise<number[][]> {
  const rounds = await RoundModel.findAll({ where: { status: 'closed', closedAt: { [Op.gte]: since } } })
  const subjects: number[][] = []
  for (const loaded of await loadRounds(rounds)) {
    const { recorded } = await cellsOf(loaded)
    for (const code of loaded.patientCodes) {
      const row = loaded.examiners.map((e) => {
        const exam = recorded.get(cellKey(e.id, code))
        return exam ? measuredHeight(exam) : null
      })
      if (row.length >= 2 && row.every((h) => h !== null)) subjects.push(row)
    }
  }
  return subjects
}

/** Closes the round; only its own educator may. Audited as `round-close`. Its entries then become readable as usual. */
export async function closeRound(user: User, id: string): Promise<void> {
  const loaded = await visibleRound(user, id)
  if (!isCreator(user, loaded)) throw new AppError('not-round-owner', 403, 'Only the educator who created the round can close it')
  await inTransaction(async (transaction) => {
    const round = await RoundModel.findByPk(id, { transaction })
    if (round!.status !== 'open') throw new AppError('round-closed', 409, 'This round is already closed')
    const closedAt = new Date()
    await round!.update({ status: 'closed', closedAt }, { transaction })
    // Touch the entries so their sync cursor moves: devices that may now read them pull them on their next sync.
    await ExamModel.sequelize!.query('UPDATE "exams" SET "roundId" = "roundId" WHERE "roundId" = :id', { replacements: { id }, transaction })
    await derivePairs(loaded.patientCodes, { sequelize: ExamModel.sequelize!, transaction })
    const changes = { status: { from: 'open', to: 'closed' }, closedAt: { from: null, to: closedAt.toISOString() } }
    await audit({ actorId: user.id, action: 'round-close', entityType: 'round', entityId: id, changes }, { transaction })
  })
  for (const listener of closeListeners) listener()
}

/** The closed round's agreement for its educator and examiners (codes as `presenterFor` shows them); while it is open, 409. */
export async function roundResults(viewer: RoundViewer, id: string): Promise<RoundResults> {
  const loaded = await visibleRound(viewer.user, id)
  if (loaded.round.status !== 'closed')
    throw new AppError('round-open', 409, 'Results are shown once the round is closed, so that no examiner sees another’s readings')
  const { recorded } = await cellsOf(loaded)
  const readings: RoundReadings = new Map([...recorded].map(([key, row]) => [key, measuredHeight(row)]))
  // The elevated threshold in force now (a setting), applied to every reading alike.
  const { elevatedAboveCm } = (await currentSettings()).values.estimate
  const stats = roundStatistics(loaded.patientCodes, loaded.examiners, readings, elevatedAboveCm)
  const codes = presenterFor(viewer, loaded)
  return {
    roundId: loaded.round.id,
    name: codes.text(loaded.round.name),
    closedAt: loaded.round.closedAt?.toISOString() ?? null,
    patientCodes: loaded.patientCodes.map(codes.code),
    examiners: loaded.examiners,
    ...stats,
    incompleteCodes: stats.incompleteCodes.map(codes.code),
    missing: { count: stats.missing.count, entries: stats.missing.entries.map((e) => ({ ...e, patientCode: codes.code(e.patientCode) })) },
    codesMasked: codes.masked,
    caution: CAUTION_TEXT,
  }
}
