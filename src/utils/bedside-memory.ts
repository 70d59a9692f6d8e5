import { z } from 'zod'

/** The two ways of recording the same draft: one screen for the experienced examiner, five steps for learners. */
export const RecordModeSchema = z.enum(['quick', 'guided'])
export type RecordMode = z.infer<typeof RecordModeSchema>

const MODE_KEY = 'plumbline.record.mode'
const LAST_KEY = 'plumbline.record.last'
const PENDING_KEY = 'plumbline.record.pending-submits'

// What the quick screen carries from one patient to the next on this device: the team and the bed's usual angle.
const LastChoicesSchema = z.object({ teamId: z.string().optional(), inclinationDeg: z.number().min(0).max(90).optional() })
export type LastChoices = z.infer<typeof LastChoicesSchema>

const PendingSubmitsSchema = z.array(z.object({ examId: z.string(), authorId: z.string() }))
export type PendingSubmit = z.infer<typeof PendingSubmitsSchema>[number]

// Private browsing or a full quota can refuse storage: the preferences are then forgotten, never an error.
function read<T>(key: string, schema: z.ZodType<T>, fallback: T): T {
  try {
    const parsed = schema.safeParse(JSON.parse(localStorage.getItem(key) ?? 'null'))
    return parsed.success ? parsed.data : fallback
  } catch {
    return fallback
  }
}

function write(key: string, value: unknown) {
  try {
    localStorage.setItem(key, JSON.stringify(value))
  } catch {
    // storage refused: the choice lasts for this visit only
  }
}

/** The mode last chosen on this device; the guided steps until one was chosen. */
export function rememberedMode(): RecordMode {
  return read(MODE_KEY, RecordModeSchema, 'guided')
}

export function rememberMode(mode: RecordMode): void {
  write(MODE_KEY, mode)
}

/** The mode a `?mode=` query asks for, else the remembered one. */
export function modeFromQuery(value: unknown): RecordMode {
  const asked = RecordModeSchema.safeParse(value)
  return asked.success ? asked.data : rememberedMode()
}

export function lastChoices(): LastChoices {
  return read(LAST_KEY, LastChoicesSchema, {})
}

export function rememberChoices(choices: LastChoices): void {
  const valid = LastChoicesSchema.safeParse(JSON.parse(JSON.stringify(choices)))
  if (valid.success) write(LAST_KEY, { ...lastChoices(), ...valid.data })
}

/** Exams saved with "Save and submit" while the server was out of reach: submitted once their save has synced. */
export function pendingSubmits(): PendingSubmit[] {
  return read(PENDING_KEY, PendingSubmitsSchema, [])
}

export function setPendingSubmits(list: PendingSubmit[]): void {
  write(PENDING_KEY, list)
}
