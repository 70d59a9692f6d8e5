import { z } from 'zod'

/** The longest id any record takes (UUIDs have 36 characters); a longer one is refused, never looked up. */
export const ID_MAX = 64

/** Years a client-sent time may fall in: outside them a typing or clock error is far likelier (product default, no published source). */
export const YEAR_MIN = 1900
export const YEAR_MAX = 2100

const UUID_SHAPE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
// C0 controls and DEL: never part of an id, a code or a search term; U+0000 also ends a statement in SQLite's parser.
const CONTROL = /[\u0000-\u001f\u007f]/
// Free text keeps tab, line feed and carriage return.
const CONTROL_IN_TEXT = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/

export const CONTROL_MESSAGE = 'Remove the control characters (such as NUL) from this value'

/** Whether a one-line value (id, code, search term, e-mail) holds a control character. */
export const hasControl = (value: string): boolean => CONTROL.test(value)

/** Whether free text holds a control character other than tab and line breaks. */
export const hasControlInText = (value: string): boolean => CONTROL_IN_TEXT.test(value)

/** A UUID in its one spelling (lower case), so `ABC…` and `abc…` name one record; anything else unchanged. */
export const lowerUuid = (value: string): string => (UUID_SHAPE.test(value) ? value.toLowerCase() : value)

/** A record's UUID, stored and compared in lower case. */
export const uuidField = (message: string) => z.uuid(message).transform((value) => value.toLowerCase())

/** A reference to a record (team, round, account): 1–64 characters without control characters; a UUID in lower case. */
export const idField = (message: string) =>
  z
    .string(message)
    .min(1, message)
    .max(ID_MAX, `An id is at most ${ID_MAX} characters`)
    .refine((value) => !hasControl(value), CONTROL_MESSAGE)
    .transform(lowerUuid)

/** A one-line filter or search term of at most `max` characters. */
export const lineField = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .refine((value) => !hasControl(value), CONTROL_MESSAGE)

/** Free text of at most `max` characters; tabs and line breaks are kept. */
export const textField = (max: number, message: string) =>
  z
    .string()
    .max(max, message)
    .refine((value) => !hasControlInText(value), CONTROL_MESSAGE)

function yearOf(value: string): number {
  // The year as written (ISO 8601 puts it first); an offset cannot move it across the limits by more than a day.
  return Number(value.slice(0, 4))
}

/** A time a client sends: ISO 8601 with an offset, in the years 1900–2100. */
export const clientTime = (message: string) =>
  z.iso
    .datetime({ offset: true, message })
    .refine((value) => yearOf(value) >= YEAR_MIN && yearOf(value) <= YEAR_MAX, `Use a date between ${YEAR_MIN} and ${YEAR_MAX}`)
