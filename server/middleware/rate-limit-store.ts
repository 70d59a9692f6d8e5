import { createHash } from 'node:crypto'
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit'
import { Op, QueryTypes, type Sequelize } from 'sequelize'
import { writeTransaction } from '../db/transaction.ts'
import { RateLimitHitModel } from '../models/index.ts'

/** Ended windows are deleted at most this often per limiter (product default, no published source). */
export const PRUNE_EVERY_MS = 60_000

// INSERT … ON CONFLICT … DO UPDATE, which SQLite (3.24 and later) and PostgreSQL both read. Every right-hand side sees
// the row as it was, so a window that has ended starts again at one hit in the same statement. Concurrent increments
// of one key wait for each other: SQLite's write lock, PostgreSQL's row lock until the transaction ends.
const INCREMENT = `INSERT INTO "rate_limit_hits" ("key", "hits", "resetAt") VALUES (:key, 1, :resetAt)
  ON CONFLICT ("key") DO UPDATE SET
    "hits" = CASE WHEN "rate_limit_hits"."resetAt" <= :now THEN 1 ELSE "rate_limit_hits"."hits" + 1 END,
    "resetAt" = CASE WHEN "rate_limit_hits"."resetAt" <= :now THEN excluded."resetAt" ELSE "rate_limit_hits"."resetAt" END`

const DECREMENT = `UPDATE "rate_limit_hits" SET "hits" = "hits" - 1 WHERE "key" = :key AND "hits" > 0 AND "resetAt" > :now`

/** The stored key: no client address or e-mail in the table, and any length fits. */
export const storedKey = (key: string): string => createHash('sha256').update(key).digest('hex')

// PostgreSQL answers BIGINT as text.
const info = (row: { hits: number | string; resetAt: number | string }): ClientRateLimitInfo => ({
  totalHits: Number(row.hits),
  resetTime: new Date(Number(row.resetAt)),
})

/**
 * express-rate-limit's counters in the `rate_limit_hits` table, so every app server on the database counts the same
 * attempts (the default store counts in each process's memory). The database is the one the models are bound to.
 */
export class DatabaseStore implements Store {
  readonly localKeys = false
  #windowMs = 60_000
  #prunedAt = 0
  readonly #now: () => number

  constructor(now: () => number = Date.now) {
    this.#now = now
  }

  get #db(): Sequelize {
    return RateLimitHitModel.sequelize!
  }

  init(options: Options): void {
    this.#windowMs = options.windowMs
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await RateLimitHitModel.findByPk(storedKey(key), { raw: true })
    return row && Number(row.resetAt) > this.#now() ? info(row) : undefined
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const now = this.#now()
    const replacements = { key: storedKey(key), now, resetAt: now + this.#windowMs }
    // The count read back in the same transaction is this request's own, whatever other servers do meanwhile.
    const row = await writeTransaction(this.#db, async (transaction) => {
      await this.#db.query(INCREMENT, { replacements, transaction })
      return RateLimitHitModel.findByPk(replacements.key, { raw: true, transaction })
    })
    await this.#prune(now)
    return info(row!)
  }

  async decrement(key: string): Promise<void> {
    await this.#db.query(DECREMENT, { type: QueryTypes.UPDATE, replacements: { key: storedKey(key), now: this.#now() } })
  }

  async resetKey(key: string): Promise<void> {
    await RateLimitHitModel.destroy({ where: { key: storedKey(key) } })
  }

  async #prune(now: number): Promise<void> {
    if (now - this.#prunedAt < PRUNE_EVERY_MS) return
    this.#prunedAt = now
    await RateLimitHitModel.destroy({ where: { resetAt: { [Op.lte]: now } } })
  }
}
