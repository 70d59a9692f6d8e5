import { Writable } from 'node:stream'
import { describe, expect, it } from 'vitest'
import { createLogger } from '../../server/logger.ts'

function capture() {
  const lines: string[] = []
  const stream = new Writable({
    write(chunk, _encoding, done) {
      lines.push(String(chunk))
      done()
    },
  })
  return { log: createLogger('info', stream), text: () => lines.join('') }
}

describe('server log', () => {
  it('redacts patient codes, including those a database error carries', () => {
    const { log, text } = capture()
    const dbError = Object.assign(new Error('Validation error'), {
      sql: "INSERT INTO exams VALUES ('SM-0142')",
      parameters: ['SM-0142'],
      fields: { patientCode: 'SM-0142' },
    })

    log.info({ patientCode: 'SM-0142', query: { patientCode: 'SM-0142' } })
    log.error({ err: dbError }, 'unhandled error')

    expect(text()).not.toContain('SM-0142')
    expect(text()).toContain('Validation error')
  })

  it('redacts passwords and tokens', () => {
    const { log, text } = capture()

    log.info({ body: { password: 'hunter22', token: 'eyJhbGciOi' } })

    expect(text()).not.toMatch(/hunter22|eyJhbGciOi/)
  })
})
