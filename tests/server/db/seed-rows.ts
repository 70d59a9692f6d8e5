import type { QueryInterface } from 'sequelize'

const at = (minutesAgo: number) => new Date(Date.UTC(2026, 11, 8, 9) - minutesAgo * 60_000)
const stamps = (minutesAgo: number) => ({ createdAt: at(minutesAgo), updatedAt: at(minutesAgo) })

export function exam(id: string, examinerId: string, minutesAgo: number, extra: Record<string, unknown> = {}) {
  return {
    id,
    patientCode: 'SM-0142',
    teamId: 'team-ward',
    examinerId,
    examinedAt: at(minutesAgo),
    inclinationDeg: 45,
    inclinationSource: 'estimated',
    vein: 'right-internal',
    columnTop: 'seen',
    heightMethod: 'ruler',
    heightCm: 4,
    readingPrecision: 'ruler',
    offsetModel: 'incline-adjusted',
    venousSigns: '[]',
    rhythm: 'regular',
    waveform: '{}',
    respiratory: 'normal',
    abdominojugular: '{}',
    status: 'submitted',
    estimate: '{}',
    verticalHeightCm: 4,
    cvpCmH2O: 9,
    ...stamps(minutesAgo),
    ...extra,
  }
}

/**
 * A small ward written straight into the latest schema: accounts with roles and teams, a session and an invitation,
 * exams (one a round entry) with a signature and a photo, audit events and a second settings version. Every table
 * that references another holds a row, so a down that rebuilds or drops a table has rows to keep or to trip over.
 */
export async function seedRows(q: QueryInterface): Promise<void> {
  await q.bulkInsert('teams', [{ id: 'team-ward', name: 'Ward 7 North', ...stamps(90) }])
  const users = ['resident', 'attending', 'admin'].map((role) => ({
    id: `user-${role}`,
    email: `${role}@ward.test`,
    displayName: `Dr ${role}`,
    passwordHash: null,
    active: true,
    ...stamps(90),
  }))
  await q.bulkInsert('users', users)
  await q.bulkInsert('user_roles', [
    { userId: 'user-resident', role: 'resident' },
    { userId: 'user-attending', role: 'resident' },
    { userId: 'user-attending', role: 'attending' },
    { userId: 'user-admin', role: 'admin' },
  ])
  const members = ['user-resident', 'user-attending'].map((userId) => ({ userId, teamId: 'team-ward', ...stamps(90) }))
  await q.bulkInsert('team_memberships', members)
  const session = { id: 'session-1', userId: 'user-resident', familyId: 'family-1', tokenHash: 'a'.repeat(64) }
  await q.bulkInsert('refresh_sessions', [{ ...session, expiresAt: at(-600), revokedAt: null, ...stamps(30) }])
  const link = { id: 'link-1', userId: 'user-admin', purpose: 'invitation', tokenHash: 'b'.repeat(64), createdBy: null }
  await q.bulkInsert('account_links', [{ ...link, expiresAt: at(-900), usedAt: null, ...stamps(80) }])
  const round = { id: 'round-1', name: 'December round', createdBy: 'user-admin', status: 'closed' }
  await q.bulkInsert('rounds', [{ ...round, createdAt: at(70), closedAt: at(20) }])
  await q.bulkInsert('round_patient_codes', [{ roundId: 'round-1', patientCode: 'SM-0142', position: 0 }])
  await q.bulkInsert('round_examiners', [{ roundId: 'round-1', examinerId: 'user-resident', position: 0 }])
  await q.bulkInsert('exams', [
    exam('exam-1', 'user-resident', 60, { submittedAt: at(55) }),
    exam('exam-2', 'user-attending', 50, { status: 'countersigned', submittedAt: at(45), returnComment: 'Re-measure' }),
    exam('exam-3', 'user-resident', 40, { roundId: 'round-1' }),
  ])
  const signer = { signerId: 'user-attending', signerName: 'Dr attending', meaning: 'countersigned', signedAt: at(30) }
  const signed = { content: '{}', contentHash: 'c'.repeat(64), supersededAt: null }
  await q.bulkInsert('signatures', [{ id: 'signature-1', examId: 'exam-2', examVersion: 1, ...signer, ...signed }])
  const file = { storedName: 'photo-1.jpg', displayName: 'neck.jpg', mimeType: 'image/jpeg', byteSize: 1024, width: 640, height: 480 }
  const by = { consentConfirmedBy: 'user-resident', createdBy: 'user-resident' }
  const photo = { sha256: 'd'.repeat(64), ...by, createdAt: at(58), deletedAt: null }
  await q.bulkInsert('attachments', [{ id: 'photo-1', examId: 'exam-1', ...file, ...photo }])
  await q.bulkInsert('audit_events', [
    { at: at(60), actorId: 'user-resident', action: 'exam-create', entityType: 'exam', entityId: 'exam-1', changes: null },
    { at: at(30), actorId: 'user-attending', action: 'exam-countersign', entityType: 'exam', entityId: 'exam-2', changes: '{"version":1}' },
  ])
  await q.bulkInsert('settings', [{ version: 2, values: '{"pairWindowMinutes":60}', changedBy: 'user-admin', changedAt: at(10) }])
}
