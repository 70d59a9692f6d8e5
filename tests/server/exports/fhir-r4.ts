import { Fhir, Versions } from 'fhir'
import { ParseConformance } from 'fhir/parseConformance'

// FHIR.js (lantanagroup/FHIR.js) with its bundled R4 definitions, chosen explicitly (node_modules/fhir/README.md):
// structure, cardinality, primitive formats and required value-set bindings of every resource in the Bundle.
const r4 = new Fhir(new ParseConformance(true, Versions.R4))

export interface R4Result {
  valid: boolean
  /** Messages of severity error or fatal, as "location: message". */
  errors: string[]
}

/** Validates a resource (here: a Bundle and everything in it) against FHIR R4; unknown properties are errors. */
export function validateR4(resource: object): R4Result {
  const result = r4.validate(resource, { errorOnUnexpected: true })
  const errors = result.messages.filter((m) => m.severity === 'error' || m.severity === 'fatal').map((m) => `${m.location}: ${m.message}`)
  return { valid: result.valid, errors }
}
