import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { MyAgreement } from '#shared/schemas/learning'
import { fetchMyAgreement } from '@/api/loop'
import { latestLoad } from './latest-load'

export const useMyAgreementStore = defineStore('my-agreement', () => {
  /** The resident an attending chose; undefined means the signed-in resident's own. */
  const residentId = ref<string | undefined>(undefined)
  const agreement = ref<MyAgreement | null>(null)
  /** Loads the chosen resident's agreement; an older answer never overwrites a newer one. */
  const { loading, load } = latestLoad(
    () => fetchMyAgreement(residentId.value),
    (answer) => (agreement.value = answer),
  )

  /** Chooses whose agreement to show; the previous resident's figures leave the screen at once. */
  function choose(id: string | undefined) {
    if (id !== residentId.value) agreement.value = null
    residentId.value = id
  }

  return { residentId, agreement, loading, load, choose }
})
