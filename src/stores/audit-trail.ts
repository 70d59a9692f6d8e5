import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { AuditQuerySchema, type AuditChainReport, type AuditEvent, type AuditQuery } from '#shared/schemas/audit'
import { fetchAuditPage, verifyAuditChain } from '@/api/audit'
import { fetchExamHistory } from '@/api/supervision'

export type AuditFilters = Pick<AuditQuery, 'actorId' | 'action' | 'entityId' | 'from' | 'to'>

const NO_FILTERS: AuditFilters = { actorId: undefined, action: undefined, entityId: undefined, from: undefined, to: undefined }

export const useAuditTrailStore = defineStore('audit-trail', () => {
  /** The page of the trail on screen, newest first. */
  const events = ref<AuditEvent[]>([])
  const total = ref(0)
  /** Filters and page of the admin's trail; kept while they look elsewhere. */
  const query = ref<AuditQuery>(AuditQuerySchema.parse({}))
  const loading = ref(false)
  /** One exam's own events, oldest first, for its history panel. */
  const history = ref<AuditEvent[]>([])
  const historyExamId = ref<string | null>(null)
  /** The last walk of the hash chain, null until an admin asks for one. */
  const chainReport = ref<AuditChainReport | null>(null)
  const verifying = ref(false)
  let latestRequest = 0

  const filters = computed<AuditFilters>(() => {
    const { actorId, action, entityId, from, to } = query.value
    return { actorId, action, entityId, from, to }
  })

  /** Loads the page `query` describes; an older answer never overwrites a newer one. */
  async function load() {
    const request = ++latestRequest
    loading.value = true
    try {
      const page = await fetchAuditPage({ ...query.value })
      if (request !== latestRequest) return
      events.value = page.events
      total.value = page.total
    } finally {
      if (request === latestRequest) loading.value = false
    }
  }

  /** Replaces the filters and goes back to the first page. */
  function setFilters(next: Partial<AuditFilters>) {
    query.value = { ...query.value, ...NO_FILTERS, ...next, page: 1 }
  }

  /** Applies the table's page; returns whether it changed, so callers reload only then. */
  function setPaging(page: number, pageSize: number): boolean {
    if (query.value.page === page && query.value.pageSize === pageSize) return false
    query.value = { ...query.value, page, pageSize }
    return true
  }

  /** Loads the history of one exam. */
  async function loadHistory(examId: string) {
    if (historyExamId.value !== examId) history.value = []
    historyExamId.value = examId
    history.value = await fetchExamHistory(examId)
  }

  /** Asks the server to walk the hash chain; keeps the previous report when the request fails. */
  async function verifyChain() {
    verifying.value = true
    try {
      chainReport.value = await verifyAuditChain()
    } finally {
      verifying.value = false
    }
  }

  return {
    events,
    total,
    query,
    loading,
    history,
    historyExamId,
    chainReport,
    verifying,
    filters,
    load,
    setFilters,
    setPaging,
    loadHistory,
    verifyChain,
  }
})
