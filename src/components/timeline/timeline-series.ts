import type { Bound } from '#shared/schemas/exam'
import type { PatientTimeline } from '#shared/schemas/timeline'

/** One exam on the time axis: its estimate (or a bound's limit) and its band, open on a bound's side. */
export interface TimelineMark {
  examId: string
  x: number
  y: number
  bound: Exclude<Bound, 'none'>
  low: number | null
  high: number | null
  elevated: boolean
}

/** The exams with an estimate, oldest first; a column that could not be assessed has none to draw. */
export function timelineMarks(timeline: PatientTimeline): TimelineMark[] {
  return timeline.exams.flatMap((exam) => {
    const { cvpCmH2O, bound, bandCmH2O, elevated } = exam.estimate
    if (cvpCmH2O === null || bound === 'none') return []
    const [low, high] = bandCmH2O ?? [null, null]
    return [{ examId: exam.id, x: Date.parse(exam.examinedAt), y: cvpCmH2O, bound, low, high, elevated: elevated === true }]
  })
}

/** The references as points in cmH₂O at the time they were measured. */
export function referenceMarks(timeline: PatientTimeline): { x: number; y: number }[] {
  return timeline.references.map((r) => ({ x: Date.parse(r.measuredAt), y: r.valueCmH2O }))
}

const timeFormat = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' })

/** A time-axis value (ms) as the axis and the tooltips print it. */
export function timeLabel(ms: number): string {
  return timeFormat.format(new Date(ms))
}
