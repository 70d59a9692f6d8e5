import { AsyncLocalStorage } from 'node:async_hooks'
import type { Sequelize } from 'sequelize'

// SQLite lets one connection write to a file at a time (https://www.sqlite.org/lockingv3.html), and Sequelize's sqlite
// dialect opens a connection per transaction: two transactions of this process would fight over the lock through the
// busy handler, each waiting on a thread of libuv's small pool. Queued here, the writers of one database take turns in
// this process and the lock is always free when one begins. PostgreSQL's write transactions take one lock first
// (write-locks.ts) and so run one after another anyway: queued here, a waiting writer holds no pooled connection, which
// the writer in turn may need for a read of its own.
const SERIALISED_DIALECTS = new Set(['sqlite', 'postgres'])

const queues = new WeakMap<Sequelize, { tail: Promise<unknown> }>()
// The turn the current async call chain holds, so a write made inside it is not queued behind it. `held` ends with the
// turn: a promise started inside it and still running later (fire and forget) must then queue like any other.
const turn = new AsyncLocalStorage<{ sequelize: Sequelize; held: boolean }>()

/** Whether the caller is inside a write turn on this database that has not ended yet. */
export function holdsWriteTurn(sequelize: Sequelize): boolean {
  const current = turn.getStore()
  return current?.sequelize === sequelize && current.held
}

/**
 * Runs `work` once every write queued before it on this database has settled, one at a time; a failed write does not
 * hold up the next. On a database not listed above, `work` runs at once.
 */
export function inWriteTurn<T>(sequelize: Sequelize, work: () => Promise<T>): Promise<T> {
  if (!SERIALISED_DIALECTS.has(sequelize.getDialect())) return work()
  const queue = queues.get(sequelize) ?? { tail: Promise.resolve() }
  queues.set(sequelize, queue)
  const result = queue.tail.then(() => {
    const current = { sequelize, held: true }
    return turn.run(current, work).finally(() => (current.held = false))
  })
  queue.tail = result.catch(() => undefined)
  return result
}
