import { z } from 'zod'
import { db } from './index'

// Per device, not per user: the prompts are about technique at this bedside device, and a shared device keeps the choice.
const DISMISSED_KEY = 'technique-prompts-dismissed'

/** The technique prompts dismissed on this device (codes; unknown ones from older versions are kept harmlessly). */
export async function loadDismissedPrompts(): Promise<string[]> {
  const parsed = z.array(z.string()).safeParse((await db.meta.get(DISMISSED_KEY))?.value)
  return parsed.success ? parsed.data : []
}

export async function saveDismissedPrompts(codes: readonly string[]): Promise<void> {
  await db.meta.put({ key: DISMISSED_KEY, value: [...codes] })
}
