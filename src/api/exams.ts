import { EstimateSchema, ExamListSchema, ExamSchema, type ExamInputRaw, type ExamListQuery, type ExamPatch } from '#shared/schemas/exam'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import { api } from './client'

export function createExam(input: ExamInputRaw) {
  return api.post('exams', { json: input }).json().then((body) => ExamSchema.parse(body))
}

export function fetchExam(id: string) {
  return api.get(`exams/${encodeURIComponent(id)}`).json().then((body) => ExamSchema.parse(body))
}

export function fetchExams(query: Partial<ExamListQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string | number>
  return api.get('exams', { searchParams }).json().then((body) => ExamListSchema.parse(body))
}

export function updateExam(id: string, patch: ExamPatch) {
  return api.patch(`exams/${encodeURIComponent(id)}`, { json: patch }).json().then((body) => ExamSchema.parse(body))
}

export function submitExam(id: string) {
  return api.post(`exams/${encodeURIComponent(id)}/submit`).json().then((body) => ExamSchema.parse(body))
}

export function estimateOnServer(findings: ExamFindingsInput) {
  return api.post('estimate', { json: findings }).json().then((body) => EstimateSchema.parse(body))
}
