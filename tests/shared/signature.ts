import type { Signature } from '#shared/schemas/signature'

/** A current, valid countersignature stamped in London summer time. */
export function makeSignature(overrides: Partial<Signature> = {}): Signature {
  return {
    id: 'sig-1',
    examId: 'exam-1',
    examVersion: 2,
    signerId: 'u-9',
    signerName: 'Dr Tomas Lindqvist',
    meaning: 'reviewed-agree',
    signedAt: '2026-07-14T09:30:00.000+01:00',
    timeZone: 'Europe/London',
    hash: 'ab'.repeat(32),
    superseded: false,
    supersededAt: null,
    valid: true,
    ...overrides,
  }
}
