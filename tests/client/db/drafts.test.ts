import { beforeEach, describe, expect, it } from 'vitest'
import { reactive } from 'vue'
import { db } from '@/db'
import { deleteDraft, listDrafts, loadDraft, saveDraft } from '@/db/drafts'
import { parseDraft } from '@/utils/bedside-steps'
import { makeDraft, WORKED_EXAMPLE } from '../factories/draft'

describe('drafts in IndexedDB', () => {
  beforeEach(async () => {
    await db.drafts.clear()
  })

  it('stores a reactive draft as a plain copy and reads it back', async () => {
    const draft = reactive(makeDraft(WORKED_EXAMPLE))

    await saveDraft(draft)

    expect(await loadDraft(draft.id)).toEqual(JSON.parse(JSON.stringify(draft)))
  })

  it('drops only the fields an older version wrote in a shape this one no longer knows', async () => {
    const draft = makeDraft({ patientCode: 'SM-0007', heightCm: 4 })
    await db.drafts.put({ ...draft, fields: { ...draft.fields, vein: 'jugular-left', venousSigns: ['double-peaked', 'wobbly'] } } as never)

    const row = await loadDraft(draft.id)

    expect(row?.fields.vein).toBeUndefined()
    expect(row?.fields.venousSigns).toEqual({ 'double-peaked': 'present' })
    expect(row?.fields.patientCode).toBe('SM-0007')
    expect(row?.fields.heightCm).toBe(4)
  })

  it('a draft saved by the previous app version (a list of signs, none of the new fields) loads and still saves as an exam', async () => {
    const { venousSigns: _signs, venousConfirmed: _confirmed, context: _context, ...older } = makeDraft(WORKED_EXAMPLE).fields
    const draft = makeDraft()
    await db.drafts.put({ ...draft, fields: { ...older, venousSigns: ['not-palpable', 'double-peaked', 'falls-on-inspiration'] } } as never)

    const row = await loadDraft(draft.id)

    expect(row?.fields.venousSigns).toEqual({ 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present' })
    expect(row?.fields.heightCm).toBe(4)
    expect(parseDraft(row!)).toMatchObject({
      venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present', 'changes-with-position': 'not-tested' },
      venousConfirmed: false,
      context: [],
    })
  })

  it('keeps the new fields: sign states, the venous confirmation, circumstances, the fall on release and a reason', async () => {
    const draft = makeDraft({
      venousSigns: { 'not-palpable': 'absent' },
      venousConfirmed: true,
      context: ['tense-ascites'],
      abdominojugular: { done: true, riseCm: 2, sustained: false, fallOnReleaseCm: 4 },
      columnTop: 'not-assessable',
      notAssessableReason: 'other',
      notAssessableText: 'Neck brace',
    })
    await saveDraft(draft)

    const row = await loadDraft(draft.id)

    expect(row?.fields).toMatchObject({
      venousSigns: { 'not-palpable': 'absent' },
      venousConfirmed: true,
      context: ['tense-ascites'],
      abdominojugular: { fallOnReleaseCm: 4 },
      notAssessableReason: 'other',
      notAssessableText: 'Neck brace',
    })
  })

  it('lists drafts newest first and filters by state', async () => {
    await saveDraft(makeDraft({}, { id: 'old', updatedAt: '2026-01-01T08:00:00.000Z' }))
    await saveDraft(makeDraft({}, { id: 'new', updatedAt: '2026-01-01T09:00:00.000Z' }))
    await saveDraft(makeDraft({}, { id: 'done', state: 'saved', updatedAt: '2026-01-01T10:00:00.000Z' }))

    const editing = await listDrafts('editing')
    const all = await listDrafts()

    expect(editing.map((row) => row.id)).toEqual(['new', 'old'])
    expect(all.map((row) => row.id)).toEqual(['done', 'new', 'old'])
  })

  it('skips a row it cannot read at all', async () => {
    await db.drafts.put({ id: 'broken' } as never)

    const rows = await listDrafts()

    expect(rows).toEqual([])
  })

  it('deletes a draft', async () => {
    const draft = makeDraft()
    await saveDraft(draft)

    await deleteDraft(draft.id)

    expect(await loadDraft(draft.id)).toBeUndefined()
  })
})
