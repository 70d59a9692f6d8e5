import { VenousSignSchema, VenousSignsSchema, type VenousSigns } from '#shared/schemas/exam'
import { FIELD_SPECS, type AuditWords } from './audit-fields'
import { formatDateTime } from './format'
import { VENOUS_SIGN_STATE_WORDS, capitalise, venousSignWords } from './exam-words'

export interface ChangeLine {
  field: string
  /** Set for a changed field; absent for other details such as a failure's reason. */
  from?: string
  to: string
  /** A raw id, hash or counter, for an admin's details only. */
  detail?: boolean
}

const MAX_TEXT = 80

function shorten(text: string): string {
  return text.length > MAX_TEXT ? `${text.slice(0, MAX_TEXT - 1)}…` : text
}

/** A stored before/after value as short readable text. */
export function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—'
  if (Array.isArray(value)) return value.length ? shorten(value.map(valueText).join(', ')) : 'none'
  if (typeof value === 'object')
    return shorten(
      Object.entries(value)
        .map(([key, inner]) => `${key} ${valueText(inner)}`)
        .join('; '),
    )
  return shorten(String(value))
}

export function isFromTo(value: unknown): value is { from: unknown; to: unknown } {
  return typeof value === 'object' && value !== null && 'from' in value && 'to' in value
}

/** Without the teams store, a team shows as not known rather than as its id. */
export const NO_NAMES: AuditWords = { teamName: () => undefined }

const WAVEFORM_LABEL: Record<string, string> = { aWave: 'a wave', vWave: 'v wave', yDescent: 'y descent' }

const isEmpty = (value: unknown) => value === null || value === undefined || value === ''

function humanise(key: string): string {
  return capitalise(key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase())
}

const ISO_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/

/** A value no field words: a stored time in the app's one format, anything else as short text. */
function plainWords(value: unknown): string {
  return typeof value === 'string' && ISO_TIME.test(value) ? formatDateTime(value) : valueText(value)
}

function oneLine(field: string, value: unknown, names: AuditWords): ChangeLine {
  const spec = FIELD_SPECS[field] ?? { label: humanise(field) }
  const words = (v: unknown) => (isEmpty(v) ? '—' : spec.words ? spec.words(v, names) : plainWords(v))
  const line: ChangeLine = isFromTo(value)
    ? { field: spec.label, from: words(value.from), to: words(value.to) }
    : { field: spec.label, to: words(value) }
  return spec.detail ? { ...line, detail: true } : line
}

function signStates(value: unknown): VenousSigns | null {
  const parsed = VenousSignsSchema.safeParse(value ?? {})
  return parsed.success ? parsed.data : null
}

/** One line per sign whose state changed; a new record's untested signs are left out. */
function venousSignLines(value: { from: unknown; to: unknown }): ChangeLine[] {
  const [before, after] = [signStates(value.from), signStates(value.to)]
  if (!before || !after) return [{ field: 'Venous signs', from: valueText(value.from), to: valueText(value.to) }]
  return VenousSignSchema.options
    .filter((sign) => before[sign] !== after[sign])
    .map((sign) => ({
      field: venousSignWords(sign),
      from: VENOUS_SIGN_STATE_WORDS[before[sign]],
      to: VENOUS_SIGN_STATE_WORDS[after[sign]],
    }))
}

function waveformLines(value: { from: unknown; to: unknown }): ChangeLine[] {
  const before = (value.from ?? {}) as Record<string, unknown>
  const after = (value.to ?? {}) as Record<string, unknown>
  return Object.keys(WAVEFORM_LABEL)
    .filter((key) => before[key] !== after[key])
    .map((key) => ({
      field: WAVEFORM_LABEL[key]!,
      from: isEmpty(before[key]) ? '—' : capitalise(String(before[key])),
      to: isEmpty(after[key]) ? '—' : capitalise(String(after[key])),
    }))
}

/** The lines one stored field gives: the venous signs and the waveform split into their parts. */
export function fieldLines(field: string, value: unknown, names: AuditWords): ChangeLine[] {
  if (field === 'venousSigns' && isFromTo(value)) return venousSignLines(value)
  if (field === 'waveform' && isFromTo(value) && typeof (value.to ?? value.from) === 'object') return waveformLines(value)
  return [oneLine(field, value, names)]
}
