import { TeamListSchema } from '#shared/schemas/user'
import { api } from './client'

export function fetchTeams() {
  return api.get('teams').json().then((body) => TeamListSchema.parse(body).teams)
}
