import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { Reference, ReferenceInput } from '#shared/schemas/reference'
import { addReference, fetchReferences } from '@/api/references'

export const useReferencesStore = defineStore('references', () => {
  /** The exam whose references are on screen. */
  const examId = ref<string | null>(null)
  /** Its references, in the order the server lists them. */
  const references = ref<Reference[]>([])
  const loading = ref(false)

  /** Loads the references of one exam; another exam's list is dropped at once. */
  async function load(id: string) {
    if (examId.value !== id) references.value = []
    examId.value = id
    loading.value = true
    try {
      const list = await fetchReferences(id)
      if (examId.value === id) references.value = list
    } finally {
      loading.value = false
    }
  }

  /** Records a reference; rejects with the ky error (400 with `fields` for bad input). */
  async function add(id: string, input: ReferenceInput) {
    const stored = await addReference(id, input)
    if (examId.value === id) references.value = [...references.value, stored]
    return stored
  }

  return { examId, references, loading, load, add }
})
