import { HealthSchema, SessionSchema, UserSchema } from '#shared/schemas/user'
import type { LoginInput } from '#shared/schemas/user'
import { api } from './client'

export function login(input: LoginInput) {
  return api.post('auth/login', { json: input }).json().then((body) => SessionSchema.parse(body))
}

export function refresh() {
  return api.post('auth/refresh').json().then((body) => SessionSchema.parse(body))
}

export async function logout() {
  await api.post('auth/logout')
}

export function fetchMe() {
  return api.get('me').json().then((body) => UserSchema.parse(body))
}

export function fetchHealth() {
  return api.get('health').json().then((body) => HealthSchema.parse(body))
}
