import { randomUUID } from 'node:crypto'
import { MEANING_LABEL } from '#shared/domain/signature-text'
import type { Bound, Exam } from '#shared/schemas/exam'
import type { Signature } from '#shared/schemas/signature'
import {
  EXTENSION,
  IDENTIFIER,
  OBSERVATION_CODE,
  OFFSET_MODEL_DISPLAY,
  PERFORMER_ROLE_DISPLAY,
  PHYSICAL_EXAMINATION,
  SYSTEM,
  VERIFICATION_SIGNATURE,
  type ObservationCode,
  type PerformerRole,
} from './fhir-codes.ts'
import type { EstimateStatements } from './exam-statements.ts'
import { notesOf } from './fhir-notes.ts'

// The slice of FHIR R4 (4.0.1) this export writes; field names as in the specification.
interface Coding {
  system: string
  code: string
  display?: string
}
interface CodeableConcept {
  coding?: Coding[]
  text?: string
}
interface Quantity {
  value: number
  comparator?: '<' | '<=' | '>=' | '>'
  unit: string
  system: string
  code: string
}
interface Reference {
  reference?: string
  type?: string
  identifier?: { system: string; value: string }
  display?: string
}
interface Component {
  code: CodeableConcept
  valueQuantity?: Quantity
  valueCodeableConcept?: CodeableConcept
  dataAbsentReason?: CodeableConcept
}
type Resource = { resourceType: string; id?: string } & Record<string, unknown>
export interface FhirBundle {
  resourceType: 'Bundle'
  id: string
  type: 'collection'
  timestamp: string
  entry: { fullUrl: string; resource: Resource }[]
}

/** FHIR R4 ObservationStatus codes this export can send. */
export type ObservationStatus = 'preliminary' | 'final' | 'amended'

/** The countersignature that holds for the record as it is now, if any. */
export function currentSignature(exam: Exam): Signature | undefined {
  return exam.signatures?.find((s) => !s.superseded)
}

/**
 * The Observation's status, from FHIR R4's ObservationStatus (hl7.org/fhir/R4/valueset-observation-status.html):
 * - `preliminary` ("an initial or interim observation: data may be incomplete or unverified") for a draft, a submitted
 *   exam awaiting countersignature and a returned one, and for a countersigned one whose signature no longer matches
 *   the record: none of them is verified by a supervisor.
 * - `final` ("complete and there are no further actions needed") once countersigned; R4 says signing is shown with
 *   Provenance beside a `final` status, which the Bundle carries.
 * - `amended` ("subsequent to being final, the observation has been modified") when it is countersigned again after
 *   an earlier countersigned version was amended. A reopened draft of a once-signed exam is `preliminary`, not
 *   `amended`: its new content is not verified yet.
 * `registered` (no result yet) never applies, since every saved exam carries its computed estimate; `cancelled`,
 * `entered-in-error` and `corrected` have no counterpart in the exam's life cycle.
 */
export function observationStatus(exam: Exam): ObservationStatus {
  const current = currentSignature(exam)
  if (exam.status !== 'countersigned' || !current?.valid) return 'preliminary'
  return exam.signatures!.some((s) => s.superseded) ? 'amended' : 'final'
}

/** Two decimals: finer than any bedside reading, and free of binary noise such as 10.077067…. */
const round2 = (value: number) => Math.round(value * 100) / 100

const UNIT = {
  cmH2O: { unit: 'cmH2O', code: 'cm[H2O]' },
  mmHg: { unit: 'mmHg', code: 'mm[Hg]' },
  cm: { unit: 'cm', code: 'cm' },
  deg: { unit: 'deg', code: 'deg' },
} as const

function quantity(value: number, unit: keyof typeof UNIT, comparator?: Quantity['comparator']): Quantity {
  return { value: round2(value), ...(comparator ? { comparator } : {}), unit: UNIT[unit].unit, system: SYSTEM.ucum, code: UNIT[unit].code }
}

function observationConcept(code: ObservationCode): CodeableConcept {
  return { coding: [{ system: SYSTEM.observation, code, display: OBSERVATION_CODE[code] }], text: OBSERVATION_CODE[code] }
}

function absent(code: 'unknown' | 'not-applicable', text: string): CodeableConcept {
  const display = code === 'unknown' ? 'Unknown' : 'Not Applicable'
  return { coding: [{ system: SYSTEM.dataAbsentReason, code, display }], text }
}

/** Above the visible neck the estimate is a lower bound, with no venous column at all an upper one. */
const COMPARATOR: Record<Bound, Quantity['comparator'] | undefined> = { point: undefined, lower: '>=', upper: '<=', none: undefined }

function quantityComponent(
  code: ObservationCode,
  value: number | null,
  unit: keyof typeof UNIT,
  ifAbsent: CodeableConcept,
  comparator?: Quantity['comparator'],
): Component {
  const concept = observationConcept(code)
  return value === null ? { code: concept, dataAbsentReason: ifAbsent } : { code: concept, valueQuantity: quantity(value, unit, comparator) }
}

function components(exam: Exam): Component[] {
  const e = exam.estimate
  const comparator = COMPARATOR[e.bound]
  const noEstimate = absent('unknown', 'The top of the venous column could not be assessed')
  const [low, high] = e.bandCmH2O ?? [null, null]
  const openBand = (side: string) =>
    e.bound === 'none' ? noEstimate : absent('not-applicable', `The estimate is a bound: its band has no ${side} limit`)
  const heightAbsent =
    exam.columnTop === 'not-filled' ? absent('not-applicable', 'No venous column was seen even lying flat') : noEstimate
  return [
    quantityComponent('cvp-estimate-mmhg', e.cvpMmHg, 'mmHg', noEstimate, comparator),
    quantityComponent('cvp-band-low', low, 'cmH2O', openBand('lower')),
    quantityComponent('cvp-band-high', high, 'cmH2O', openBand('upper')),
    quantityComponent('jvp-height', e.heightCm, 'cm', heightAbsent, e.bound === 'lower' ? '>=' : undefined),
    quantityComponent('trunk-inclination', exam.inclinationDeg, 'deg', noEstimate),
    quantityComponent('offset-distance', e.offsetCm, 'cm', noEstimate),
    {
      code: observationConcept('offset-model'),
      valueCodeableConcept: {
        coding: [{ system: SYSTEM.offsetModel, code: e.offsetModel, display: OFFSET_MODEL_DISPLAY[e.offsetModel] }],
        text: OFFSET_MODEL_DISPLAY[e.offsetModel],
      },
    },
  ]
}

export interface BundleOptions {
  /** The reader sees the keyed pseudonym, not the patient code (educators). */
  masked: boolean
  /** The estimate in words, for the notes: statements, cautions and the reviewed band. */
  statements: EstimateStatements
  /** When the Bundle is assembled. */
  now?: Date
  /** Makes ids for the resources that have none of their own (roles, provenance, the Bundle). */
  uuid?: () => string
}

/**
 * The exam as a FHIR R4 Bundle of type `collection`: one Observation (the estimate), a Practitioner and a
 * PractitionerRole per performer, and, when countersigned, a Provenance carrying the signature. `collection` rather
 * than `document`: a document needs a Composition as its first entry and is attested as a whole, while this is one
 * observation sent with the resources it points at; the signature belongs to the Observation, so it is its Provenance.
 */
export function examBundle(exam: Exam, options: BundleOptions): FhirBundle {
  const uuid = options.uuid ?? randomUUID
  const now = (options.now ?? new Date()).toISOString()
  const observationUrl = `urn:uuid:${exam.id}`
  const entries: FhirBundle['entry'] = []
  const practitioners = new Map<string, string>()

  const practitioner = (id: string, name: string): Reference => {
    const fullUrl = `urn:uuid:${id}`
    if (!practitioners.has(id)) {
      practitioners.set(id, fullUrl)
      const resource = { resourceType: 'Practitioner', id, identifier: [{ system: IDENTIFIER.user, value: id }], name: [{ text: name }] }
      entries.push({ fullUrl, resource })
    }
    return { reference: fullUrl, type: 'Practitioner', display: name }
  }
  const role = (id: string, name: string, code: PerformerRole): Reference => {
    const fullUrl = `urn:uuid:${uuid()}`
    const resource = {
      resourceType: 'PractitionerRole',
      practitioner: practitioner(id, name),
      code: [{ coding: [{ system: SYSTEM.performerRole, code, display: PERFORMER_ROLE_DISPLAY[code] }], text: PERFORMER_ROLE_DISPLAY[code] }],
    }
    entries.push({ fullUrl, resource })
    return { reference: fullUrl, type: 'PractitionerRole', display: `${name} (${PERFORMER_ROLE_DISPLAY[code].toLowerCase()})` }
  }

  const e = exam.estimate
  const signature = currentSignature(exam)
  const signed = signature?.valid && exam.status === 'countersigned' ? signature : undefined
  const performer = [role(exam.examinerId, exam.examinerName, 'examiner')]
  if (signed) performer.push(role(signed.signerId, signed.signerName, 'countersigning-attending'))

  const observation: Resource = {
    resourceType: 'Observation',
    id: exam.id,
    meta: { versionId: String(exam.version), lastUpdated: exam.updatedAt },
    identifier: [{ system: IDENTIFIER.exam, value: exam.id }],
    status: observationStatus(exam),
    category: [{ coding: [{ system: SYSTEM.observationCategory, code: 'exam', display: 'Exam' }] }],
    code: observationConcept('cvp-estimate'),
    subject: {
      type: 'Patient',
      identifier: { system: options.masked ? IDENTIFIER.patientPseudonym : IDENTIFIER.patientCode, value: exam.patientCode },
    },
    effectiveDateTime: exam.examinedAt,
    issued: exam.updatedAt,
    performer,
    ...(e.cvpCmH2O === null
      ? { dataAbsentReason: absent('unknown', 'The top of the venous column could not be assessed') }
      : { valueQuantity: quantity(e.cvpCmH2O, 'cmH2O', COMPARATOR[e.bound]) }),
    note: notesOf(exam, options.statements),
    method: { coding: [PHYSICAL_EXAMINATION], text: 'Bedside jugular venous pressure exam' },
    component: components(exam),
  }
  entries.unshift({ fullUrl: observationUrl, resource: observation })

  if (signed) {
    const who = performer[1]!
    entries.push({
      fullUrl: `urn:uuid:${uuid()}`,
      resource: {
        resourceType: 'Provenance',
        target: [{ reference: observationUrl, type: 'Observation' }],
        recorded: signed.signedAt,
        agent: [
          {
            type: { coding: [{ system: SYSTEM.provenanceParticipant, code: 'verifier', display: 'Verifier' }] },
            who,
          },
        ],
        signature: [
          {
            extension: [{ url: EXTENSION.signedContentSha256, valueString: signed.hash }],
            type: [VERIFICATION_SIGNATURE, { system: SYSTEM.signatureMeaning, code: signed.meaning, display: MEANING_LABEL[signed.meaning] }],
            when: signed.signedAt,
            who,
          },
        ],
      },
    })
  }
  return { resourceType: 'Bundle', id: uuid(), type: 'collection', timestamp: now, entry: entries }
}
