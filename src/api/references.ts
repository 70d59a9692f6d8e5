import { ReferenceListSchema, ReferenceSchema, type ReferenceInput } from '#shared/schemas/reference'
import { api } from './client'

const referencesPath = (examId: string) => `exams/${encodeURIComponent(examId)}/references`

/** The measured pressures recorded beside one exam, each saying whether it pairs with the exam. */
export function fetchReferences(examId: string) {
  return api.get(referencesPath(examId)).json().then((body) => ReferenceListSchema.parse(body).references)
}

/** Records a measured pressure beside an exam; the server audits it. */
export function addReference(examId: string, input: ReferenceInput) {
  return api.post(referencesPath(examId), { json: input }).json().then((body) => ReferenceSchema.parse(body))
}
