import { HealthSchema, SessionSchema, UserSchema } from '#shared/schemas/user'
import type { LoginInput, Session } from '#shared/schemas/user'
import { api } from './client'

export function login(input: LoginInput) {
  return api.post('auth/login', { json: input }).json().then((body) => SessionSchema.parse(body))
}

/** A new session from the refresh cookie; null when the browser holds none (the server answers 204, nobody signed in). */
export async function refresh(): Promise<Session | null> {
  const response = await api.post('auth/refresh')
  if (response.status === 204) return null
  return SessionSchema.parse(await response.json())
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
