import { describe, expect, it } from 'vitest'
import { LoginInputSchema } from '#shared/schemas/user'

describe('LoginInputSchema', () => {
  it('trims and lower-cases the e-mail so sign-in is case-insensitive', () => {
    const input = LoginInputSchema.parse({ email: '  Resident@Saltmarsh.TEST ', password: 'x' })

    expect(input.email).toBe('resident@saltmarsh.test')
  })

  it('names each bad field', () => {
    const result = LoginInputSchema.safeParse({ email: 'no-at-sign', password: '' })

    expect(result.success).toBe(false)
    expect(result.error?.issues.map((i) => i.path.join('.')).sort()).toEqual(['email', 'password'])
  })
})
