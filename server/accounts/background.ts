import type { Logger } from 'pino'

const running = new Set<Promise<void>>()

/** Runs work after the response has gone; failures are logged, never sent. */
export function runAfterResponse(log: Logger, what: string, work: () => Promise<void>): void {
  const task = work()
    .catch((err: unknown) => log.error({ err }, `${what} failed`))
    .finally(() => running.delete(task))
  running.add(task)
}

/** Resolves once no such work is running: for tests and shutdown. */
export async function afterResponseIdle(): Promise<void> {
  while (running.size) await Promise.allSettled([...running])
}
