import type { AgreementPairList, AgreementPairsQuery, AgreementQuery, AgreementSummary } from '#shared/schemas/agreement'
import type { User } from '#shared/schemas/user'
import { pairFilter, pairScopeOf, pairTime } from './agreement-scope.ts'
import { presentPairs } from './pair-list.ts'
import type { Pair } from './pairs.ts'
import { programPairs } from './program-pairs.ts'
import { summarize } from './summary.ts'

export interface AgreementOptions {
  /** The pairing window (§6: a setting, 120 minutes by default). */
  windowMinutes?: number
}

export interface AgreementViewer {
  user: User
  /** The pseudonym shown instead of a patient code the viewer may not read. */
  mask: (patientCode: string) => string
}

/** The program's pairs narrowed to the viewer's scope and the query's filters. */
async function pairsFor(user: User, query: AgreementQuery, options: AgreementOptions) {
  const scope = await pairScopeOf(user, query)
  const keep = pairFilter({ ...query, examinerId: scope.examinerId })
  const { pairs, examiners } = await programPairs(options.windowMinutes)
  return { pairs: pairs.filter((p) => keep(p) && scope.includes(p)), scope, examiners }
}

export async function agreementSummary(user: User, query: AgreementQuery, options: AgreementOptions = {}): Promise<AgreementSummary> {
  const { pairs, scope, examiners } = await pairsFor(user, query, options)
  return summarize(pairs, examiners, scope.examinerId)
}

/** Newest pairs first. */
export async function listAgreementPairs(
  viewer: AgreementViewer,
  query: AgreementPairsQuery,
  options: AgreementOptions = {},
): Promise<AgreementPairList> {
  const { pairs, scope, examiners } = await pairsFor(viewer.user, query, options)
  const newestFirst = pairs.sort((a, b) => pairTime(b) - pairTime(a) || a.first.rowid - b.first.rowid)
  const page = newestFirst.slice((query.page - 1) * query.pageSize, query.page * query.pageSize)
  const codeOf = (pair: Pair) => (scope.showsCode(pair) ? pair.first.patientCode : viewer.mask(pair.first.patientCode))
  const presented = await presentPairs(page, examiners, codeOf)
  return { pairs: presented, total: pairs.length, page: query.page, pageSize: query.pageSize }
}
