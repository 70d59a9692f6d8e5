// Kept in memory only so an XSS payload cannot lift it from storage.
let token: string | null = null

export function getToken() {
  return token
}

export function setToken(value: string | null) {
  token = value
}
