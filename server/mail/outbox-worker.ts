import { randomUUID } from 'node:crypto'
import { hostname } from 'node:os'
import type { Logger } from 'pino'
import type { Sequelize } from 'sequelize'
import { claim, dueMessages, markFailed, markSent, queueState, releaseStale, type OutboxRow } from './outbox-store.ts'

export interface RetryPolicy {
  /** Wait after the 1st, 2nd, … failed attempt; the last value repeats. */
  retryDelaysMs: number[]
  maxAttempts: number
}

export interface OutboxWorkerOptions extends RetryPolicy {
  /** The database holding the outbox; undefined while there is none yet. */
  db(): Sequelize | undefined
  deliver(row: OutboxRow): Promise<void>
  /** A failure that retrying cannot cure. */
  isPermanent(err: unknown): boolean
  log: Logger
  /** How often to look for messages other servers queued (or whose sender stopped mid-attempt). */
  pollMs: number
  /** A claim older than this belongs to a server that stopped mid-attempt. */
  staleAfterMs: number
}

const BATCH = 20
const REMEMBERED = 1_000

/** Sends what the outbox holds, one claimed row at a time, retrying with capped backoff; safe to run on several servers. */
export class OutboxWorker {
  readonly #options: OutboxWorkerOptions
  readonly #id = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`
  readonly #waiters: (() => void)[] = []
  #timer: NodeJS.Timeout | undefined
  #running: Promise<void> | undefined
  #again = false
  #closed = false
  /** Queued messages as last counted, plus those queued since. */
  #queued = 0
  /**
   * Messages this worker delivered lately. Should the write marking one sent be lost (rolled back with a transaction
   * that shared the connection), the row comes back due; it is then marked sent again instead of going out twice.
   */
  readonly #delivered = new Set<string>()

  constructor(options: OutboxWorkerOptions) {
    this.#options = options
  }

  get queued(): number {
    return this.#queued
  }

  /** Messages were committed to the outbox: send them now. */
  added(count: number): void {
    this.#queued += count
    this.kick()
  }

  kick(): void {
    if (this.#closed) return
    if (this.#running) return void (this.#again = true)
    clearTimeout(this.#timer)
    this.#running = this.#run().finally(() => (this.#running = undefined))
  }

  idle(): Promise<void> {
    if (this.#closed || (!this.#running && this.#queued === 0)) return Promise.resolve()
    return new Promise((resolve) => this.#waiters.push(resolve))
  }

  close(): void {
    this.#closed = true
    clearTimeout(this.#timer)
    this.#waiters.splice(0).forEach((resolve) => resolve())
  }

  async #run(): Promise<void> {
    let wait = this.#options.pollMs
    try {
      do {
        this.#again = false
        wait = await this.#pump()
      } while (this.#again && !this.#closed)
    } catch (err) {
      this.#options.log.error({ err }, 'outbox not read; will try again')
    }
    if (this.#closed) return
    if (this.#queued === 0) this.#waiters.splice(0).forEach((resolve) => resolve())
    this.#timer = setTimeout(() => this.kick(), Math.min(Math.max(0, wait), this.#options.pollMs))
    this.#timer.unref()
  }

  /** Sends every due message; returns the milliseconds until the next one is due. */
  async #pump(): Promise<number> {
    const db = this.#options.db()
    if (!db) return this.#options.pollMs
    await releaseStale(db, new Date(Date.now() - this.#options.staleAfterMs))
    for (let due = await dueMessages(db, new Date(), BATCH); due.length && !this.#closed; due = await dueMessages(db, new Date(), BATCH)) {
      for (const row of due) if (!this.#closed && (await claim(db, row.id, this.#id, new Date()))) await this.#attempt(db, row)
    }
    const { queued, nextDueAt } = await queueState(db)
    this.#queued = queued
    return nextDueAt ? nextDueAt.getTime() - Date.now() : this.#options.pollMs
  }

  #remember(id: string): void {
    this.#delivered.add(id)
    if (this.#delivered.size > REMEMBERED) this.#delivered.delete(this.#delivered.values().next().value!)
  }

  async #attempt(db: Sequelize, row: OutboxRow): Promise<void> {
    const { deliver, isPermanent, log, maxAttempts, retryDelaysMs } = this.#options
    const attempt = row.attempts + 1
    const about = { template: row.template, messageId: row.id, attempt }
    try {
      if (!this.#delivered.has(row.id)) await deliver(row)
      this.#remember(row.id)
      await markSent(db, row.id, this.#id, new Date())
      log.info(about, 'delivered')
    } catch (err) {
      const { code, responseCode } = (err ?? {}) as { code?: unknown; responseCode?: unknown }
      const giveUp = attempt >= maxAttempts || isPermanent(err)
      const retryInMs = retryDelaysMs[Math.min(attempt, retryDelaysMs.length) - 1] ?? 0
      await markFailed(db, row.id, this.#id, err, giveUp ? null : new Date(Date.now() + retryInMs))
      if (giveUp) log.error({ ...about, code, responseCode }, 'given up')
      else log.warn({ ...about, code, responseCode, retryInMs }, 'not delivered; will retry')
    }
  }
}
