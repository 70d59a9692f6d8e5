import type { AuditChainReport } from '#shared/schemas/audit'

/** The verification in plain text, for the terminal. */
export function describeReport(report: AuditChainReport): string {
  const head = report.head ? `row ${report.head.seq} (${report.head.at}), hash ${report.head.hash}` : 'none'
  if (report.ok) {
    return [
      `Audit chain intact: ${report.checkedRows} row(s) verified.`,
      `Last row: ${head}.`,
      'Keep the last row somewhere else: rows cut from the end of the chain leave no gap to detect.',
    ].join('\n')
  }
  const broken = report.firstBreak!
  return [
    `Audit chain BROKEN (${broken.kind}) at ${broken.seq === null ? 'an unchained row' : `sequence ${broken.seq}`}, time ${broken.at ?? 'unknown'}.`,
    broken.message,
    `${report.checkedRows} row(s) verified before the break; last good row: ${head}.`,
  ].join('\n')
}
