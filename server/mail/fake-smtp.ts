import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server'

export interface CapturedMessage {
  to: string[]
  from: string
  subject: string
  text: string
  /** ISO 8601, server clock. */
  receivedAt: string
}

export interface FakeSmtp {
  port: number
  /** What arrived, oldest first. */
  messages(): CapturedMessage[]
  clear(): void
  close(): Promise<void>
}

export interface FakeSmtpOptions {
  host?: string
  port?: number
  /** How many messages to keep; older ones are dropped. */
  keep?: number
}

const MAX_MESSAGE_BYTES = 1024 * 1024

async function capture(stream: SMTPServerDataStream, session: SMTPServerSession): Promise<CapturedMessage> {
  const mail = await simpleParser(stream)
  return {
    // The envelope, not the To header: it is who the message was actually delivered to.
    to: session.envelope.rcptTo.map((r) => r.address),
    from: mail.from?.text ?? '',
    subject: mail.subject ?? '',
    text: mail.text ?? '',
    receivedAt: new Date().toISOString(),
  }
}

function createServer(keep: number, kept: CapturedMessage[]): SMTPServer {
  return new SMTPServer({
    authOptional: true,
    // Plain SMTP on loopback: no certificate to trust, nothing to log in with.
    disabledCommands: ['STARTTLS', 'AUTH'],
    disableReverseLookup: true,
    size: MAX_MESSAGE_BYTES,
    rejectOversized: true,
    logger: false,
    closeTimeout: 1_000,
    onData(stream, session, callback) {
      capture(stream, session).then((message) => {
        kept.push(message)
        kept.splice(0, Math.max(0, kept.length - keep))
        callback()
      }, callback)
    },
  })
}

/** A real SMTP server that keeps what it receives in memory, for demo mode and tests. */
export async function startFakeSmtp({ host = '127.0.0.1', port = 0, keep = 500 }: FakeSmtpOptions = {}): Promise<FakeSmtp> {
  const kept: CapturedMessage[] = []
  const server = createServer(keep, kept)
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, host, () => {
      server.off('error', reject)
      resolve()
    })
  })
  // A client dropping its connection must not take the app down with it.
  server.on('error', () => {})
  return {
    port: (server.server.address() as AddressInfo).port,
    messages: () => [...kept],
    clear: () => void kept.splice(0),
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
