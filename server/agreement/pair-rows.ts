import type { InferAttributes } from 'sequelize'
import { inclinationBandOf } from '#shared/schemas/agreement'
import type { AgreementPairModel } from '../models/index.ts'
import type { ExamPair, PairColumnTop, Reading } from './pairs.ts'

export type PairRow = InferAttributes<AgreementPairModel>

/** SQLite hands a DATE back as text, other dialects as a Date. */
export const millis = (value: Date | string) => (typeof value === 'string' ? Date.parse(value) : value.getTime())

/** The `agreement_pairs` row of a pair: its time is the earlier exam's, its band that of the mean inclination. */
export function rowOf({ earlier: e, later: l }: ExamPair): PairRow {
  const meanInclinationDeg = (e.inclinationDeg + l.inclinationDeg) / 2
  return {
    earlierExamId: e.examId,
    laterExamId: l.examId,
    patientCode: e.patientCode,
    pairedAt: new Date(e.at),
    meanInclinationDeg,
    inclinationBand: inclinationBandOf(meanInclinationDeg),
    earlierExaminerId: e.examinerId,
    laterExaminerId: l.examinerId,
    earlierTeamId: e.teamId,
    laterTeamId: l.teamId,
    earlierExaminedAt: new Date(e.at),
    laterExaminedAt: new Date(l.at),
    earlierHeightCm: e.heightCm,
    laterHeightCm: l.heightCm,
    earlierCvpCmH2O: e.cvpCmH2O,
    laterCvpCmH2O: l.cvpCmH2O,
    earlierInclinationDeg: e.inclinationDeg,
    laterInclinationDeg: l.inclinationDeg,
    earlierVein: e.vein,
    laterVein: l.vein,
    earlierColumnTop: e.columnTop,
    laterColumnTop: l.columnTop,
  }
}

/** The pair a row holds; the patient code is shared by both readings. */
export function examPairOf(row: PairRow): ExamPair {
  const earlier: Reading = {
    examId: row.earlierExamId,
    patientCode: row.patientCode,
    examinerId: row.earlierExaminerId,
    teamId: row.earlierTeamId,
    at: millis(row.earlierExaminedAt),
    heightCm: row.earlierHeightCm,
    cvpCmH2O: row.earlierCvpCmH2O,
    inclinationDeg: row.earlierInclinationDeg,
    vein: row.earlierVein,
    columnTop: row.earlierColumnTop as PairColumnTop,
  }
  const later: Reading = {
    examId: row.laterExamId,
    patientCode: row.patientCode,
    examinerId: row.laterExaminerId,
    teamId: row.laterTeamId,
    at: millis(row.laterExaminedAt),
    heightCm: row.laterHeightCm,
    cvpCmH2O: row.laterCvpCmH2O,
    inclinationDeg: row.laterInclinationDeg,
    vein: row.laterVein,
    columnTop: row.laterColumnTop as PairColumnTop,
  }
  return { earlier, later }
}
