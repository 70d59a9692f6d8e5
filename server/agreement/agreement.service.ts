import type { AgreementPairList, AgreementPairsQuery, AgreementQuery, AgreementSummary, AgreementTrend } from '#shared/schemas/agreement'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { pairWhereFor } from './agreement-scope.ts'
import { attendingIdsOf, loadExaminers } from './examiners.ts'
import { pairGroups } from './pair-groups.ts'
import { presentPairs } from './pair-list.ts'
import { pairPage } from './pair-page.ts'
import { orient, type Pair } from './pairs.ts'
import { summarize } from './summary.ts'
import { monthlyTrend } from './trend.ts'

export interface AgreementViewer {
  user: User
  /** The pseudonym shown instead of a patient code the viewer may not read. */
  mask: (patientCode: string) => string
}

/**
 * The statistics of the viewer's pairs matching the query, from `agreement_pairs` with one aggregate query. The
 * difference's order follows the examiners' roles as they stand now, so a change of roles needs no pairing again.
 */
export async function agreementSummary(user: User, query: AgreementQuery): Promise<AgreementSummary> {
  const { scope, where } = await pairWhereFor(user, query)
  const [groups, examiners] = await Promise.all([pairGroups(where), loadExaminers()])
  return summarize(groups, examiners, scope.examinerId)
}

/** Bias and limits per calendar month (UTC) over the same pairs as the summary. */
export async function agreementTrend(user: User, query: AgreementQuery): Promise<AgreementTrend> {
  const { where } = await pairWhereFor(user, query)
  return monthlyTrend(where, attendingIdsOf(await loadExaminers()))
}

/** A pairs download is an export, so it is audited: once, on its first page, with the filters and the pair count. */
async function auditExport(user: User, query: AgreementPairsQuery, rows: number) {
  const { page: _page, pageSize: _pageSize, export: format, ...filters } = query
  const filter = Object.fromEntries(Object.entries(filters).filter(([, v]) => v !== undefined && v !== ''))
  await audit({ actorId: user.id, action: 'agreement-pairs-export', entityType: 'export', changes: { format, filter, rows } })
}

/**
 * Newest pairs with a measured height on both sides first (those the plots draw); with `export`, the first page also
 * records the download in the audit trail.
 */
export async function listAgreementPairs(viewer: AgreementViewer, query: AgreementPairsQuery): Promise<AgreementPairList> {
  const { scope, where } = await pairWhereFor(viewer.user, query)
  const examiners = await loadExaminers()
  const { pairs, total } = await pairPage(where, attendingIdsOf(examiners), query.page, query.pageSize)
  const isAttending = (id: string) => examiners.get(id)?.role === 'attending'
  const codeOf = (pair: Pair) => (scope.showsCode(pair) ? pair.first.patientCode : viewer.mask(pair.first.patientCode))
  const presented = presentPairs(pairs.map((pair) => orient(pair, isAttending)), examiners, codeOf)
  if (query.export && query.page === 1) await auditExport(viewer.user, query, total)
  return { pairs: presented, total, page: query.page, pageSize: query.pageSize }
}
