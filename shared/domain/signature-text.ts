import type { Signature, SignatureMeaning } from '../schemas/signature.ts'

/** What each meaning attests, as every manifestation words it (21 CFR 11.50(a)(3)). */
export const MEANING_LABEL: Record<SignatureMeaning, string> = {
  'reviewed-agree': 'reviewed, and agrees with the findings',
  'reviewed-re-examined': 'reviewed after examining the patient in person',
}

const UTC_NAMES = new Set(['UTC', 'Etc/UTC', 'Etc/GMT', 'GMT'])

function zoneOrUtc(timeZone: string): string {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone })
    return timeZone
  } catch {
    return 'UTC'
  }
}

/** A server time in the zone it was stamped in, e.g. "14 Mar 2026, 09:30 GMT (Europe/London)". */
export function timeInZone(iso: string, timeZone: string): string {
  const zone = zoneOrUtc(timeZone)
  const text = new Intl.DateTimeFormat('en-GB', {
    ...{ day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
    ...{ hourCycle: 'h23', timeZoneName: 'short', timeZone: zone },
  } as const).format(new Date(iso))
  return UTC_NAMES.has(zone) ? text : `${text} (${zone})`
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
