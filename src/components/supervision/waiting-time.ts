/** How long an exam has waited, coarse enough to read at a glance: "under a minute", "42 min", "5 h 10 min", "3 d 2 h". */
export function waitingText(seconds: number): string {
  const minutes = Math.floor(seconds / 60)
  if (minutes < 1) return 'under a minute'
  if (minutes < 60) return `${minutes} min`
  const hours = Math.floor(minutes / 60)
  if (hours < 24) return `${hours} h ${minutes % 60} min`
  return `${Math.floor(hours / 24)} d ${hours % 24} h`
}

const A_DAY = 24 * 60 * 60

/** Exams waiting a day or more are flagged in the queue. */
export function waitedLong(seconds: number): boolean {
  return seconds >= A_DAY
}
