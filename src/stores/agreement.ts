import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { AgreementPair, AgreementQuery, AgreementSummary, AgreementTrend } from '#shared/schemas/agreement'
import { fetchAgreementPairs, fetchAgreementSummary, fetchAgreementTrend } from '@/api/agreement'

/** The dashboard's filters; residents' answers are narrowed to themselves by the server. */
export type AgreementFilters = Pick<AgreementQuery, 'from' | 'to' | 'teamId' | 'inclinationBand' | 'vein'>

/** The plots draw at most this many pairs, the newest (the largest page the API serves); the figures use them all. */
export const PLOT_PAIR_LIMIT = 1000

export const NO_AGREEMENT_FILTERS: AgreementFilters = { from: undefined, to: undefined, teamId: undefined, inclinationBand: undefined, vein: undefined }

export const useAgreementStore = defineStore('agreement', () => {
  const filters = ref<AgreementFilters>({ ...NO_AGREEMENT_FILTERS })
  const summary = ref<AgreementSummary | null>(null)
  const trend = ref<AgreementTrend | null>(null)
  /** The newest pairs, for the plots. */
  const pairs = ref<AgreementPair[]>([])
  /** How many pairs match, of which `pairs` holds at most PLOT_PAIR_LIMIT. */
  const totalPairs = ref(0)
  const loading = ref(false)
  let latestRequest = 0

  /** Loads the summary, the trend and the plotted pairs for the filters; an older answer never overwrites a newer one. */
  async function load() {
    const request = ++latestRequest
    const query = { ...filters.value }
    loading.value = true
    try {
      const [s, t, list] = await Promise.all([
        fetchAgreementSummary(query),
        fetchAgreementTrend(query),
        fetchAgreementPairs({ ...query, page: 1, pageSize: PLOT_PAIR_LIMIT }),
      ])
      if (request !== latestRequest) return
      summary.value = s
      trend.value = t
      pairs.value = list.pairs
      totalPairs.value = list.total
    } finally {
      if (request === latestRequest) loading.value = false
    }
  }

  function setFilters(next: Partial<AgreementFilters>) {
    filters.value = { ...NO_AGREEMENT_FILTERS, ...next }
  }

  /** Every pair the filters select, newest first, page by page, for the CSV; the server audits the download. */
  async function allPairs(): Promise<AgreementPair[]> {
    const query = { ...filters.value }
    const all: AgreementPair[] = []
    for (let page = 1; ; page++) {
      const list = await fetchAgreementPairs({ ...query, page, pageSize: PLOT_PAIR_LIMIT, export: 'csv' })
      all.push(...list.pairs)
      if (list.pairs.length < PLOT_PAIR_LIMIT || page * PLOT_PAIR_LIMIT >= list.total) return all
    }
  }

  return { filters, summary, trend, pairs, totalPairs, loading, load, setFilters, allPairs }
})
