/** A statistic to two decimals, with a true minus sign. */
export function twoDp(value: number): string {
  return value.toFixed(2).replace('-', '−')
}

/** A signed length in cm to one decimal: "+1.2", "−0.8", "0.0". */
export function signedCm(value: number | null): string {
  if (value === null) return '—'
  const rounded = Math.round(value * 10) / 10
  const text = Math.abs(rounded).toFixed(1)
  return rounded > 0 ? `+${text}` : rounded < 0 ? `−${text}` : text
}

/** Server field errors of the create form, gathered per input: `patientCodes.2` goes under the codes, naming the code. */
export function createFormErrors(fields: Record<string, string>, input: { patientCodes: string[]; examinerNames: string[] }) {
  const errors: Record<'name' | 'patientCodes' | 'examinerIds', string[]> = { name: [], patientCodes: [], examinerIds: [] }
  for (const [key, message] of Object.entries(fields)) {
    const [field, index] = key.split('.') as [string, string | undefined]
    if (field !== 'name' && field !== 'patientCodes' && field !== 'examinerIds') continue
    const item =
      index === undefined ? undefined : field === 'patientCodes' ? input.patientCodes[Number(index)] : input.examinerNames[Number(index)]
    errors[field].push(item ? `${item}: ${message}` : message)
  }
  return errors
}
