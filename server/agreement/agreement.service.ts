import type { AgreementPairList, AgreementPairsQuery, AgreementQuery, AgreementSummary, AgreementTrend } from '#shared/schemas/agreement'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { pairFilter, pairScopeOf, pairTime } from './agreement-scope.ts'
import { presentPairs } from './pair-list.ts'
import type { Pair } from './pairs.ts'
import { programPairs } from './pair-store.ts'
import { pointPairs, summarize } from './summary.ts'
import { monthlyTrend } from './trend.ts'

export interface AgreementViewer {
  user: User
  /** The pseudonym shown instead of a patient code the viewer may not read. */
  mask: (patientCode: string) => string
}

/** The program's pairs narrowed to the viewer's scope and the query's filters. */
async function pairsFor(user: User, query: AgreementQuery) {
  const scope = await pairScopeOf(user, query)
  const keep = pairFilter({ ...query, examinerId: scope.examinerId })
  const { pairs, examiners } = await programPairs()
  return { pairs: pairs.filter((p) => keep(p) && scope.includes(p)), scope, examiners }
}

export async function agreementSummary(user: User, query: AgreementQuery): Promise<AgreementSummary> {
  const { pairs, scope, examiners } = await pairsFor(user, query)
  return summarize(pairs, examiners, scope.examinerId)
}

/** Bias and limits per calendar month (UTC) over the same pairs as the summary. */
export async function agreementTrend(user: User, query: AgreementQuery): Promise<AgreementTrend> {
  const { pairs } = await pairsFor(user, query)
  return monthlyTrend(pairs)
}

/** A pairs download is an export, so it is audited: once, on its first page, with the filters and the pair count. */
async function auditExport(user: User, query: AgreementPairsQuery, rows: number) {
  const { page: _page, pageSize: _pageSize, export: format, ...filters } = query
  const filter = Object.fromEntries(Object.entries(filters).filter(([, v]) => v !== undefined && v !== ''))
  await audit({ actorId: user.id, action: 'agreement-pairs-export', entityType: 'export', changes: { format, filter, rows } })
}

const byExamId = (a: Pair, b: Pair) => (a.first.examId < b.first.examId ? -1 : a.first.examId > b.first.examId ? 1 : 0)

/**
 * Newest pairs with a measured height on both sides first (those the plots draw); with `export`, the first page also
 * records the download in the audit trail.
 */
export async function listAgreementPairs(viewer: AgreementViewer, query: AgreementPairsQuery): Promise<AgreementPairList> {
  const { pairs: all, scope, examiners } = await pairsFor(viewer.user, query)
  const pairs = pointPairs(all)
  const newestFirst = pairs.sort((a, b) => pairTime(b) - pairTime(a) || byExamId(a, b))
  const page = newestFirst.slice((query.page - 1) * query.pageSize, query.page * query.pageSize)
  const codeOf = (pair: Pair) => (scope.showsCode(pair) ? pair.first.patientCode : viewer.mask(pair.first.patientCode))
  const presented = presentPairs(page, examiners, codeOf)
  if (query.export && query.page === 1) await auditExport(viewer.user, query, pairs.length)
  return { pairs: presented, total: pairs.length, page: query.page, pageSize: query.pageSize }
}
