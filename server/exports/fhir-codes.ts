/**
 * Every code system, identifier system and extension the FHIR export uses. Our own URIs live under
 * `https://plumbline.example/fhir`; each of their codes is listed in README.md, "FHIR export codes".
 */
const OWN = 'https://plumbline.example/fhir'

export const SYSTEM = {
  // Standard systems, as the FHIR R4 specification names them.
  ucum: 'http://unitsofmeasure.org',
  snomed: 'http://snomed.info/sct',
  observationCategory: 'http://terminology.hl7.org/CodeSystem/observation-category',
  dataAbsentReason: 'http://terminology.hl7.org/CodeSystem/data-absent-reason',
  provenanceParticipant: 'http://terminology.hl7.org/CodeSystem/provenance-participant-type',
  // ASTM E1762-95(2013) signature types, the system of Signature.type in R4 (as profiled in HL7 Da Vinci CDex).
  signatureType: 'urn:iso-astm:E1762-95:2013',
  // Ours.
  observation: `${OWN}/CodeSystem/observation`,
  offsetModel: `${OWN}/CodeSystem/offset-model`,
  performerRole: `${OWN}/CodeSystem/performer-role`,
  signatureMeaning: `${OWN}/CodeSystem/signature-meaning`,
} as const

export const IDENTIFIER = {
  /** The patient code as the recording clinician typed it (pseudonymous already: never a name). */
  patientCode: `${OWN}/sid/patient-code`,
  /** The keyed pseudonym of the patient code that educators see; stable per deployment secret. */
  patientPseudonym: `${OWN}/sid/patient-pseudonym`,
  user: `${OWN}/sid/user`,
  exam: `${OWN}/sid/exam`,
} as const

export const EXTENSION = {
  /** SHA-256 (hex) of the exact record version a countersignature is bound to (21 CFR 11.70). */
  signedContentSha256: `${OWN}/StructureDefinition/signed-content-sha256`,
} as const

/**
 * The observation and its components. No LOINC code means "CVP estimated from the bedside jugular venous exam":
 * 8591-0 and 60985-9 are central venous pressure as measured (profiles use them for invasive monitoring), and no
 * LOINC or SNOMED CT code for the JVP exam could be confirmed (HL7's Clinical Practice Guidelines IG,
 * hl7.org/fhir/uv/cpg, uses a local `jvp` code for want of one). Sending a measured-CVP code would let a receiver
 * chart this estimate as an invasive reading, so the codes are our own.
 */
export const OBSERVATION_CODE = {
  'cvp-estimate': 'Central venous pressure estimated from the bedside jugular venous exam',
  'cvp-estimate-mmhg': 'Estimated central venous pressure in mmHg',
  'cvp-band-low': 'Lower limit of the 95% uncertainty band of the estimate',
  'cvp-band-high': 'Upper limit of the 95% uncertainty band of the estimate',
  'jvp-height': 'Vertical height of the top of the jugular venous column above the sternal angle',
  'trunk-inclination': 'Trunk inclination from horizontal',
  'offset-model': 'Model of the distance from the sternal angle to the mid right atrium',
  'offset-distance': 'Distance from the sternal angle to the mid right atrium added to the height',
} as const
export type ObservationCode = keyof typeof OBSERVATION_CODE

export const OFFSET_MODEL_DISPLAY = {
  'incline-adjusted': 'Incline-adjusted offset (CT-derived medians of Seth et al. 2002)',
  'fixed-5cm': 'Fixed 5 cm offset at every inclination',
} as const

export const PERFORMER_ROLE_DISPLAY = {
  examiner: 'Examiner who recorded the exam',
  'countersigning-attending': 'Attending who countersigned the exam',
} as const
export type PerformerRole = keyof typeof PERFORMER_ROLE_DISPLAY

/**
 * Method: SNOMED CT 5880005 "Physical examination procedure (procedure)", as HL7's mCODE implementation guide puts in
 * Observation.method for a clinician's examination finding (HL7/fhir-mCODE-ig,
 * input/pagecontent/Observation-ecog-performance-status-jenny-m-notes.md). R4 binds Observation.method only to an
 * example value set, so any SNOMED CT procedure is allowed there.
 */
export const PHYSICAL_EXAMINATION = { system: SYSTEM.snomed, code: '5880005', display: 'Physical examination procedure' } as const

/** ASTM E1762-95(2013) "Verification Signature": a signature attesting that the signer reviewed the content. */
export const VERIFICATION_SIGNATURE = { system: SYSTEM.signatureType, code: '1.2.840.10065.1.12.1.5', display: 'Verification Signature' } as const
