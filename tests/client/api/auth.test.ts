import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { refresh } from '@/api/auth'
import { configureApiBase } from '@/api/client'
import { makeUser } from '../factories/user'

function answer(response: Response) {
  const fetch = vi.fn(async () => response)
  vi.stubGlobal('fetch', fetch)
  return fetch
}

describe('refresh (POST /api/auth/refresh)', () => {
  beforeEach(() => {
    configureApiBase('http://localhost/api/')
  })

  afterEach(() => {
    vi.unstubAllGlobals()
  })

  it('when the server answers 204 (this browser holds no refresh cookie), resolves to no session', async () => {
    answer(new Response(null, { status: 204 }))

    const session = await refresh()

    expect(session).toBeNull()
  })

  it('when the server answers a session, resolves to the parsed token and user', async () => {
    const user = makeUser({ id: 'u-1' })
    answer(Response.json({ token: 't-1', user }))

    const session = await refresh()

    expect(session).toEqual({ token: 't-1', user })
  })

  it('when the server answers a session of the wrong shape, rejects', async () => {
    answer(Response.json({ token: 't-1' }))

    await expect(refresh()).rejects.toThrow()
  })

  it('when the server refuses the cookie (401), rejects with the HTTP error', async () => {
    const body = { error: { code: 'session-expired', message: 'Your session has ended; sign in again' } }
    answer(Response.json(body, { status: 401 }))

    await expect(refresh()).rejects.toMatchObject({ response: { status: 401 } })
  })
})
