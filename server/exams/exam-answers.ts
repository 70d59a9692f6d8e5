import { sortedJson } from './exam-columns.ts'
import { scopeOf, type ExamScope } from './exam-access.ts'
import { examCaches, examDataVersion, type PageCache } from './exam-caches.ts'
import type { Viewer } from './exam-queries.ts'

/** What a cached read of exams is made of for this reader now: their scope and the caches with their context. */
export interface ExamRead {
  scope: ExamScope
  cache: PageCache
  /** The key of an answer of this kind to this query: the reader's scope, the query, the data version, the mask. */
  keyOf(kind: string, query: object): string
}

export async function examRead(viewer: Viewer): Promise<ExamRead> {
  const { facts } = viewer
  const [scope, version] = await Promise.all([scopeOf(viewer.user, facts), facts?.dataVersion ?? examDataVersion()])
  // The pseudonym of a fixed text tells one mask (one server secret) from another without holding the secret.
  const context = `${version.names}|${viewer.mask('plumbline/cache')}`
  return {
    scope,
    cache: { views: examCaches().views, context },
    keyOf: (kind, query) => sortedJson([kind, scope.key, query, version.exams, context]),
  }
}
