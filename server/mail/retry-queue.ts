import type { Logger } from 'pino'

export interface RetryPolicy {
  /** Wait after the 1st, 2nd, … failed attempt; the last value repeats. */
  retryDelaysMs: number[]
  maxAttempts: number
}

export interface RetryQueueOptions<T> extends RetryPolicy {
  deliver(item: T): Promise<void>
  /** What a log line may say about an item: never its content. */
  describe(item: T): Record<string, unknown>
  /** A failure that retrying cannot cure. */
  isPermanent(err: unknown): boolean
  log: Logger
}

interface Job<T> {
  item: T
  attempts: number
  dueAt: number
}

/** Delivers items one at a time, in memory, retrying each with capped backoff until it goes or is given up. */
export class RetryQueue<T> {
  readonly #options: RetryQueueOptions<T>
  readonly #jobs: Job<T>[] = []
  readonly #waiters: (() => void)[] = []
  #timer: NodeJS.Timeout | undefined
  #running = false
  #closed = false

  constructor(options: RetryQueueOptions<T>) {
    this.#options = options
  }

  get size(): number {
    return this.#jobs.length
  }

  add(item: T): void {
    if (this.#closed) return
    this.#jobs.push({ item, attempts: 0, dueAt: Date.now() })
    if (!this.#running) this.#schedule()
  }

  idle(): Promise<void> {
    if (this.#closed || this.#jobs.length === 0) return Promise.resolve()
    return new Promise((resolve) => this.#waiters.push(resolve))
  }

  /** Stops delivering; what is still queued is dropped, and says so in the log. */
  close(): void {
    this.#closed = true
    if (this.#jobs.length > 0) this.#options.log.warn({ dropped: this.#jobs.length }, 'queue closed with items undelivered')
    this.#jobs.splice(0)
    this.#schedule()
  }

  async #pump() {
    if (this.#running || this.#closed) return
    this.#running = true
    for (let job = this.#nextDue(); job && !this.#closed; job = this.#nextDue()) await this.#attempt(job)
    this.#running = false
    this.#schedule()
  }

  #nextDue(): Job<T> | undefined {
    return this.#jobs.find((job) => job.dueAt <= Date.now())
  }

  #schedule() {
    clearTimeout(this.#timer)
    if (this.#closed || this.#jobs.length === 0) return void this.#waiters.splice(0).forEach((resolve) => resolve())
    const wait = Math.min(...this.#jobs.map((job) => job.dueAt)) - Date.now()
    this.#timer = setTimeout(() => void this.#pump(), Math.max(0, wait))
  }

  async #attempt(job: Job<T>) {
    job.attempts += 1
    try {
      await this.#options.deliver(job.item)
      this.#remove(job)
      this.#options.log.info(this.#about(job), 'delivered')
      // The other end is back: what waits out its backoff can go now.
      for (const other of this.#jobs) other.dueAt = Math.min(other.dueAt, Date.now())
    } catch (err) {
      this.#failed(job, err)
    }
  }

  #failed(job: Job<T>, err: unknown) {
    const { maxAttempts, retryDelaysMs, isPermanent, log } = this.#options
    if (job.attempts >= maxAttempts || isPermanent(err)) {
      this.#remove(job)
      return log.error(this.#about(job, err), 'given up')
    }
    const retryInMs = retryDelaysMs[Math.min(job.attempts, retryDelaysMs.length) - 1] ?? 0
    job.dueAt = Date.now() + retryInMs
    log.warn({ ...this.#about(job, err), retryInMs }, 'not delivered; will retry')
  }

  // The error's codes only: its message and the server's reply can quote addresses.
  #about(job: Job<T>, err?: unknown) {
    const { code, responseCode } = (err ?? {}) as { code?: unknown; responseCode?: unknown }
    return { ...this.#options.describe(job.item), attempt: job.attempts, code, responseCode }
  }

  #remove(job: Job<T>) {
    const index = this.#jobs.indexOf(job)
    if (index >= 0) this.#jobs.splice(index, 1)
  }
}
