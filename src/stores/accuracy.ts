import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { AccuracyQuery, AccuracySummary } from '#shared/schemas/reference'
import { fetchAccuracy } from '@/api/loop'
import { latestLoad } from './latest-load'

export const NO_ACCURACY_FILTERS: AccuracyQuery = { from: undefined, to: undefined, teamId: undefined, kind: undefined }

export const useAccuracyStore = defineStore('accuracy', () => {
  const filters = ref<AccuracyQuery>({ ...NO_ACCURACY_FILTERS })
  const summary = ref<AccuracySummary | null>(null)
  /** Loads the accuracy summary for the filters; an older answer never overwrites a newer one. */
  const { loading, load } = latestLoad(
    () => fetchAccuracy({ ...filters.value }),
    (answer) => (summary.value = answer),
  )

  function setFilters(next: Partial<AccuracyQuery>) {
    filters.value = { ...NO_ACCURACY_FILTERS, ...next }
  }

  return { filters, summary, loading, load, setFilters }
})
