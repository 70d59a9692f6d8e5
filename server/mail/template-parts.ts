import { formatDate, formatDateTimeZone } from '#shared/domain/date-time'
import type { MailMessage } from './mailer.ts'

/** What an e-mail may say about an exam. E-mail is not a safe channel for patient identifiers. */
export interface ExamRef {
  id: string
  examinedAt: Date | string
  teamName: string
  /** Read only to blank it out of free text such as a comment; never printed. */
  patientCode?: string
}

export interface TemplateContext {
  /** Where the app is served, e.g. `https://plumbline.example.org`; links are built on it. */
  baseUrl: string
  /** IANA zone for dates and times; the server's own by default. */
  timeZone?: string
  /** Locale (BCP 47) for dates and times; the server's own by default. */
  locale?: string
}

export type { MailMessage }

export const AID_NOTE = 'The venous pressure estimate in Plumbline is an aid to the bedside exam; clinical judgement decides.'
const FOOTER = '— Plumbline, the bedside JVP recorder. This message was sent automatically; replies are not read.'

export function link(baseUrl: string, path: string): string {
  return `${baseUrl.replace(/\/+$/, '')}${path}`
}

export function dateText(value: Date | string, timeZone?: string, locale?: string): string {
  return formatDate(value, { timeZone, locale })
}

/** Date and time with the zone's name, as a signature must show them. */
export function dateTimeText(value: Date | string, timeZone?: string, locale?: string): string {
  return formatDateTimeZone(value, { timeZone, locale })
}

export function examText(exam: ExamRef, timeZone?: string, locale?: string): string {
  return `an exam recorded on ${dateText(exam.examinedAt, timeZone, locale)} in ${exam.teamName}`
}

export function examLink(baseUrl: string, exam: ExamRef): string {
  return link(baseUrl, `/exams/${encodeURIComponent(exam.id)}`)
}

/** Blanks the patient code out of text a person typed (any case). */
export function scrub(text: string, patientCode?: string): string {
  const code = patientCode?.trim()
  if (!code) return text
  return text.replace(new RegExp(code.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'), 'gi'), '[patient code removed]')
}

export function body(...paragraphs: string[]): string {
  return [...paragraphs, FOOTER].join('\n\n')
}
