import type { Signature, SignatureMeaning } from '../schemas/signature.ts'
import { formatDateTimeZone } from './date-time.ts'

/** What each meaning attests, as every manifestation words it (21 CFR 11.50(a)(3)). */
export const MEANING_LABEL: Record<SignatureMeaning, string> = {
  'reviewed-agree': 'reviewed, and agrees with the findings',
  'reviewed-re-examined': 'reviewed after examining the patient in person',
}

/** A server time in the zone it was stamped in, e.g. "14 Mar 2026, 09:30 GMT (Europe/London)". */
export function timeInZone(iso: string, timeZone: string): string {
  return formatDateTimeZone(iso, { locale: 'en-GB', timeZone })
}

/** The signature's manifestation on one line: printed name, date and time with zone, meaning, and whether it still holds. */
export function signatureText(signature: Signature): string {
  const when = timeInZone(signature.signedAt, signature.timeZone)
  const core = `${signature.signerName}, ${when}; meaning: ${MEANING_LABEL[signature.meaning]}; version ${signature.examVersion}.`
  const superseded = signature.supersededAt ? ` on ${timeInZone(signature.supersededAt, signature.timeZone)}` : ''
  const head = signature.superseded
    ? `Superseded countersignature (the record was amended after signing${superseded}): `
    : 'Countersigned by '
  const warning = signature.valid ? '' : ' INTEGRITY WARNING: the record no longer matches what was signed.'
  return head + core + warning
}
