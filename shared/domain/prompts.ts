import type { ExamFindings, Prompt } from '../schemas/exam.ts'

/** Rise or fall (cm) that makes the abdominojugular test positive. */
export const ABDOMINOJUGULAR_POSITIVE_CM = 4

/**
 * Positive by either published criterion: a rise of ≥ 4 cm that stays up while the pressure is held (Cook & Simel
 * 1996, JAMA 275:630–634), or an abrupt fall of ≥ 4 cm on release (Ewy 1988, Ann Intern Med 109:456–460).
 */
export function abdominojugularPositive(findings: Pick<ExamFindings, 'abdominojugular'>): boolean {
  const { done, riseCm, sustained, fallOnReleaseCm } = findings.abdominojugular
  if (!done) return false
  const rise = sustained === true && (riseCm ?? 0) >= ABDOMINOJUGULAR_POSITIVE_CM
  return rise || (fallOnReleaseCm ?? 0) >= ABDOMINOJUGULAR_POSITIVE_CM
}

function abdominojugularFinding(f: ExamFindings): string {
  const { riseCm, sustained, fallOnReleaseCm } = f.abdominojugular
  const parts = [
    sustained === true && (riseCm ?? 0) >= ABDOMINOJUGULAR_POSITIVE_CM ? `sustained rise of ${riseCm!.toFixed(1)} cm` : null,
    (fallOnReleaseCm ?? 0) >= ABDOMINOJUGULAR_POSITIVE_CM ? `abrupt fall of ${fallOnReleaseCm!.toFixed(1)} cm on release` : null,
  ]
  return `Abdominojugular test positive (${parts.filter(Boolean).join('; ')})`
}

type PromptRule = [applies: (f: ExamFindings) => boolean, prompt: (f: ExamFindings) => Prompt]

const SINUS_QUERY = 'The rhythm was recorded as sinus, yet no a waves were seen: check the rhythm (ECG) and look again.'

// Differentials: Harrison's Manual of Medicine (JVP waveform table); blunted y and the additions to steep y from
// Int J Clin Cardiol, Table 4 (clinmedjournals.org); Kussmaul sign: Harrison's Manual of Medicine.
const RULES: PromptRule[] = [
  [(f) => f.waveform.aWave === 'cannon', () => ({
    code: 'cannon-a-waves',
    finding: 'Cannon a waves (atrioventricular dissociation)',
    differential: ['complete heart block', 'ventricular tachycardia', 'junctional rhythm'],
  })],
  [(f) => f.waveform.aWave === 'prominent', () => ({
    code: 'prominent-a-waves',
    finding: 'Prominent a waves',
    differential: ['pulmonary hypertension', 'tricuspid stenosis', 'pulmonary stenosis'],
  })],
  [(f) => f.waveform.aWave === 'absent', (f) => ({
    code: 'absent-a-waves',
    finding: 'No a waves',
    differential: ['atrial fibrillation'],
    ...(f.rhythm === 'sinus' ? { query: SINUS_QUERY } : {}),
  })],
  [(f) => f.waveform.vWave === 'large', () => ({ code: 'large-v-waves', finding: 'Large v (cv) waves', differential: ['tricuspid regurgitation'] })],
  [(f) => f.waveform.yDescent === 'steep', () => ({
    code: 'steep-y-descent',
    finding: 'Steep y descent',
    differential: ['constrictive pericarditis', 'restrictive cardiomyopathy', 'severe tricuspid regurgitation', 'right-ventricular infarction'],
  })],
  [(f) => f.waveform.yDescent === 'blunted', () => ({
    code: 'blunted-y-descent',
    finding: 'Blunted y descent',
    differential: ['cardiac tamponade (check for pulsus paradoxus)'],
  })],
  [(f) => f.respiratory === 'rises-on-inspiration', () => ({
    code: 'kussmaul-sign',
    finding: 'Column rises on inspiration (Kussmaul sign; not a feature of tamponade)',
    differential: ['constrictive pericarditis', 'restrictive cardiomyopathy', 'right-ventricular infarction'],
  })],
  [abdominojugularPositive, (f) => ({
    code: 'abdominojugular-positive',
    finding: abdominojugularFinding(f),
    differential: ['raised right-sided filling pressure', 'in heart failure, raised left-sided filling pressure (Ewy 1988)'],
  })],
]

/** Prompts from Plumbline: patterns the findings suggest, each with its differential, in a fixed order. Never diagnoses. */
export function promptsFor(findings: ExamFindings): Prompt[] {
  return RULES.filter(([applies]) => applies(findings)).map(([, prompt]) => prompt(findings))
}
