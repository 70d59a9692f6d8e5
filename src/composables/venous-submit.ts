import { computed, ref, type Ref } from 'vue'
import { hasArterialEvidence } from '#shared/domain/estimate'
import type { Exam } from '#shared/schemas/exam'
import { readApiError } from '@/api/client'

/**
 * Submitting an exam that holds arterial evidence (a palpable pulsation, or one light pressure does not obliterate:
 * Cook & Simel 1996, JAMA 275:630–634) needs the author's confirmation that the column is venous. The confirmation
 * is asked when the record shows the evidence, or once the server's refusal names the field; its message stays on it.
 */
export function useVenousSubmit(exam: Ref<Exam | null>, canSubmit: Ref<boolean>, send: (confirmVenous: boolean) => Promise<void>) {
  const confirmed = ref(false)
  const error = ref('')
  const failure = ref('')
  const serverAsked = ref(false)
  const ask = computed(() => canSubmit.value && !!exam.value && ((hasArterialEvidence(exam.value) && !exam.value.venousConfirmed) || serverAsked.value))

  /** True once sent; false when stopped for the confirmation or refused (the reason in `error` or `failure`). */
  async function submit(): Promise<boolean> {
    error.value = ''
    failure.value = ''
    if (ask.value && !confirmed.value) {
      error.value = 'Confirm that the column is venous before submitting'
      return false
    }
    try {
      await send(ask.value)
      return true
    } catch (e) {
      const refusal = await readApiError(e)
      serverAsked.value ||= Boolean(refusal.fields.venousConfirmed)
      if (refusal.fields.venousConfirmed) error.value = refusal.fields.venousConfirmed
      else failure.value = refusal.message
      return false
    }
  }

  return { ask, confirmed, error, failure, submit }
}
