import { afterEach, describe, expect, it } from 'vitest'
import nodemailer from 'nodemailer'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'

let fake: FakeSmtp | undefined

afterEach(async () => {
  await fake?.close()
  fake = undefined
})

async function sendTo(port: number, subject: string, to = ['someone@example.test']) {
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port })
  await transport.sendMail({ from: 'Plumbline <no-reply@plumbline.test>', to, subject, text: `Body of ${subject}` })
}

describe('fake SMTP server', () => {
  it('takes a message over a real SMTP conversation and keeps recipients, sender, subject, text and arrival time', async () => {
    fake = await startFakeSmtp()

    await sendTo(fake.port, 'Hello', ['a@example.test', 'b@example.test'])

    const [message] = fake.messages()
    expect(message).toMatchObject({ to: ['a@example.test', 'b@example.test'], subject: 'Hello' })
    expect(message!.from).toContain('no-reply@plumbline.test')
    expect(message!.text.trim()).toBe('Body of Hello')
    expect(new Date(message!.receivedAt).toISOString()).toBe(message!.receivedAt)
  })

  it('keeps only the most recent messages up to its limit, oldest first', async () => {
    fake = await startFakeSmtp({ keep: 2 })

    for (const subject of ['first', 'second', 'third']) await sendTo(fake.port, subject)

    expect(fake.messages().map((m) => m.subject)).toEqual(['second', 'third'])
  })

  it('forgets what it caught when cleared', async () => {
    fake = await startFakeSmtp()
    await sendTo(fake.port, 'Before')

    fake.clear()

    expect(fake.messages()).toEqual([])
  })

  it('listens on the port it is given', async () => {
    const first = await startFakeSmtp()
    const { port } = first
    await first.close()

    fake = await startFakeSmtp({ port })

    expect(fake.port).toBe(port)
  })
})
