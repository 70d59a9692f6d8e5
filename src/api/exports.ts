import type { ExamExportQuery } from '#shared/schemas/export'
import { api } from './client'

/** Exports can take a while for a whole program; the default 10 s is for interactive calls. */
const EXPORT_TIMEOUT_MS = 60_000

/** Hands a downloaded file to the browser to save, under the given name. */
export function saveBlob(blob: Blob, filename: string) {
  const url = URL.createObjectURL(blob)
  const link = document.createElement('a')
  link.href = url
  link.download = filename
  link.rel = 'noopener'
  document.body.appendChild(link)
  link.click()
  link.remove()
  // the click has started the download; the URL is no longer needed
  setTimeout(() => URL.revokeObjectURL(url), 0)
}

/** The exam as a FHIR R4 Bundle (JSON), saved as a file. */
export async function downloadExamFhir(id: string) {
  const blob = await api.get(`exams/${encodeURIComponent(id)}/fhir`, { timeout: EXPORT_TIMEOUT_MS }).blob()
  saveBlob(blob, `plumbline-exam-${id}.fhir.json`)
}

/** The exams the filters select, as CSV, saved as a file. */
export async function downloadExamsCsv(filters: Partial<ExamExportQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(filters).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string>
  const blob = await api.get('exports/exams.csv', { searchParams, timeout: EXPORT_TIMEOUT_MS }).blob()
  saveBlob(blob, `plumbline-exams-${new Date().toISOString().slice(0, 10)}.csv`)
}
