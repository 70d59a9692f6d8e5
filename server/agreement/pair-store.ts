import { loadExaminers, type Examiner } from './examiners.ts'
import { mirroredPairs } from './pair-mirror.ts'
import { orient, type ExamPair, type Pair } from './pairs.ts'

export interface ProgramPairs {
  pairs: readonly Pair[]
  /** Everyone who examined, with their printed name and pairing role as they stand now. */
  examiners: Map<string, Examiner>
}

// The same stored pairs and the same roles give the same differences: kept per array of stored pairs.
const oriented = new WeakMap<readonly ExamPair[], { roles: string; pairs: readonly Pair[] }>()
const rolesOf = (examiners: Map<string, Examiner>) => [...examiners].map(([id, e]) => `${id}:${e.role}`).join()

/**
 * Every pair of the program (from `agreement_pairs`), each in its difference's order by the examiners' roles as they
 * stand now, so a change of roles needs no pairing again; with everyone who examined.
 */
export async function programPairs(): Promise<ProgramPairs> {
  const [examiners, stored] = await Promise.all([loadExaminers(), mirroredPairs()])
  const roles = rolesOf(examiners)
  let entry = oriented.get(stored)
  if (entry?.roles !== roles) {
    const isAttending = (id: string) => examiners.get(id)?.role === 'attending'
    oriented.set(stored, (entry = { roles, pairs: stored.map((pair) => orient(pair, isAttending)) }))
  }
  return { pairs: entry.pairs, examiners }
}
