import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { PASSWORD_MAX, PASSWORD_MIN, passwordRuleProblem } from '#shared/schemas/account'
import { commonPasswords, passwordProblem } from '../../../server/accounts/password-policy.ts'
import { UserModel } from '../../../server/models/index.ts'
import { makeCaller } from '../helpers.ts'
import { appWithMail, setPassword, tokenIn } from './harness.ts'

describe('password rules', () => {
  // Lengths from OWASP ASVS 4.0.3 2.1.1 (at least 12) and 2.1.2 (at least 64 allowed, more than 128 denied).
  it('asks for 12 to 128 characters, counting code points', () => {
    expect(PASSWORD_MIN).toBe(12)
    expect(PASSWORD_MAX).toBe(128)
    expect(passwordProblem('eleven-char')).toMatch(/at least 12/)
    expect(passwordProblem('x'.repeat(6) + 'ab-cd-efgh')).toBeNull()
    expect(passwordProblem('quiet harbour '.repeat(10))).toMatch(/at most 128/)
    // 12 emoji are 24 UTF-16 units but 12 characters (ASVS 2.1.4: any Unicode character is allowed).
    expect(passwordRuleProblem('🌊🐚🦀🐟🌊🐚🦀🐟🌊🐚🦀🐟')).toBeNull()
    expect(passwordRuleProblem('🌊🐚🦀🐟🌊🐚🦀🐟🌊🐚🦀')).toMatch(/at least 12/)
  })

  it('refuses a password containing the e-mail address’s local part, in any case', () => {
    expect(passwordProblem('MyNameIsNadia.Ferreira!', 'nadia.ferreira@saltmarsh.test')).toMatch(/e-mail/)
    expect(passwordProblem('tide tables for the old pier', 'nadia.ferreira@saltmarsh.test')).toBeNull()
  })

  // List: SecLists' 10-million-password-list-top-10000 (Mark Burnett), see the header of common-passwords.txt.
  it('refuses very common passwords, also with digits or symbols around them', () => {
    expect(commonPasswords().size).toBeGreaterThan(1000)
    expect(commonPasswords().has('123456')).toBe(true) // rank 1 of that list
    expect(passwordProblem('qwerty123456')).toMatch(/very common/)
    expect(passwordProblem('1qaz2wsx3edc')).toMatch(/very common/)
    expect(passwordProblem('Password12345!')).toMatch(/very common/)
    expect(passwordProblem('!!sunshine2024')).toMatch(/very common/)
    expect(passwordProblem('Correct Horse Battery Staple')).toMatch(/very common/)
  })

  it('refuses a long run of very few characters', () => {
    expect(passwordProblem('abababababababab')).toMatch(/different characters/)
  })
})

describe('POST /api/auth/set-password answers a weak password with fields.password and keeps the link usable', () => {
  it.each([
    ['too short', 'short-one', /at least 12/],
    ['contains the e-mail', 'iamnadia.ferreira2026', /e-mail/],
    ['very common', 'qwertyuiop123', /very common/],
  ])('%s', async (_case, password, message) => {
    const { app, delivered } = await appWithMail()
    const admin = await makeCaller({ roles: ['admin'] })
    const invited = await request(app)
      .post('/api/admin/accounts')
      .set('Authorization', admin.auth)
      .send({ email: 'nadia.ferreira@saltmarsh.test', displayName: 'Dr Nadia Ferreira', roles: ['resident'] })
    const token = tokenIn((await delivered())[0])

    const weak = await setPassword(app, token, password)
    const good = await setPassword(app, token)

    expect(weak.status).toBe(400)
    expect(Object.keys(weak.body.error.fields)).toEqual(['password'])
    expect(weak.body.error.fields.password).toMatch(message)
    expect(good.status).toBe(200)
    expect((await UserModel.findByPk(invited.body.id))!.passwordHash).not.toBeNull()
  })
})
