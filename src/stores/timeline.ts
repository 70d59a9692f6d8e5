import { defineStore } from 'pinia'
import { ref } from 'vue'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { PatientTimeline } from '#shared/schemas/timeline'
import { serverUnreachable } from '@/api/client'
import { fetchPatientTimeline } from '@/api/loop'
import { localExamsOfPatient } from '@/db/local-exam-list'
import { latestLoad } from './latest-load'
import { useSessionStore } from './session'

async function fetchOrLocal(patientCode: string): Promise<{ timeline: PatientTimeline; local: boolean }> {
  try {
    return { timeline: await fetchPatientTimeline(patientCode), local: false }
  } catch (e) {
    const userId = useSessionStore().user?.id
    // Only a missing network falls back; a refusal (403 for masked codes) is an answer to show.
    if (!serverUnreachable(e) || !userId) throw e
    const exams = await localExamsOfPatient(userId, patientCode)
    return { timeline: { patientCode, exams, references: [], caution: CAUTION_TEXT }, local: true }
  }
}

export const useTimelineStore = defineStore('timeline', () => {
  /** The patient on screen: their exams oldest first and the references beside them. */
  const timeline = ref<PatientTimeline | null>(null)
  /** The server could not be reached: the exams are this device's copies, and references are not kept offline. */
  const fromDevice = ref(false)
  const latest = latestLoad(fetchOrLocal, (answer) => {
    timeline.value = answer.timeline
    fromDevice.value = answer.local
  })

  /** Loads one patient's timeline from the server, or from this device's copies when the server is out of reach. */
  async function load(patientCode: string) {
    if (timeline.value?.patientCode !== patientCode) timeline.value = null
    await latest.load(patientCode)
  }

  return { timeline, fromDevice, loading: latest.loading, load }
})
