import { RoundDetailSchema, RoundListSchema, RoundResultsSchema, type RoundCreateInput } from '#shared/schemas/round'
import { api } from './client'

const roundPath = (id: string, action = '') => `rounds/${encodeURIComponent(id)}${action ? `/${action}` : ''}`

/** Educators: the rounds they created; residents and attendings: the rounds they examine in. */
export function fetchRounds() {
  return api.get('rounds').json().then((body) => RoundListSchema.parse(body).rounds)
}

export function fetchRound(id: string) {
  return api.get(roundPath(id)).json().then((body) => RoundDetailSchema.parse(body))
}

export function createRound(input: RoundCreateInput) {
  return api.post('rounds', { json: input }).json().then((body) => RoundDetailSchema.parse(body))
}

export function closeRound(id: string) {
  return api.post(roundPath(id, 'close'), { json: {} }).json().then((body) => RoundDetailSchema.parse(body))
}

/** Only once the round is closed; 409 `round-open` before. */
export function fetchRoundResults(id: string) {
  return api.get(roundPath(id, 'results')).json().then((body) => RoundResultsSchema.parse(body))
}
