import bcrypt from 'bcryptjs'
import { afterEach, describe, expect, it } from 'vitest'
import { BCRYPT_COST, closePasswordHashing, hashPassword, verifyPassword } from '../../../server/auth/passwords.ts'

afterEach(async () => {
  await closePasswordHashing()
})

describe('password hashing in the worker pool', () => {
  it('makes a bcrypt hash at the configured cost that bcryptjs itself accepts, and verifies only the right password', async () => {
    const hash = await hashPassword('correct-horse-battery')

    expect(bcrypt.getRounds(hash)).toBe(BCRYPT_COST)
    expect(bcrypt.compareSync('correct-horse-battery', hash)).toBe(true)
    expect(await verifyPassword('correct-horse-battery', hash)).toBe(true)
    expect(await verifyPassword('wrong-horse-battery', hash)).toBe(false)
  })

  it('answers false for an account without a password', async () => {
    expect(await verifyPassword('correct-horse-battery', null)).toBe(false)
  })

  it('starts again after the pool was closed by a graceful shutdown', async () => {
    const before = await hashPassword('correct-horse-battery')
    await closePasswordHashing()

    const after = await hashPassword('correct-horse-battery')

    expect(await verifyPassword('correct-horse-battery', before)).toBe(true)
    expect(await verifyPassword('correct-horse-battery', after)).toBe(true)
  })

  it('answers many hashes asked for at once, each of its own password', async () => {
    const passwords = Array.from({ length: 12 }, (_, i) => `password-number-${i}`)

    const hashes = await Promise.all(passwords.map(hashPassword))

    expect(hashes.map((hash, i) => bcrypt.compareSync(passwords[i]!, hash))).toEqual(Array(12).fill(true))
  })
})
