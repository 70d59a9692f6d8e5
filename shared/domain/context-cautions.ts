import type { ContextFlag, ExamFindings } from '../schemas/exam.ts'

/** How each circumstance changes how the reading is read; shown beside the result. */
export const CONTEXT_CAUTION_TEXT: Record<ContextFlag, string> = {
  'positive-pressure-ventilation':
    'Positive-pressure ventilation: the raised intrathoracic pressure lifts the column, so it reads higher than the ' +
    'filling pressure it stands for, more so with PEEP (common practice, no source); bedside estimates agreed less with ' +
    'the catheter in ventilated patients (Cook 1990, Am J Med Sci, PMID 2316561).',
  'svc-obstruction-suspected':
    'Superior vena cava obstruction suspected: the neck veins then fill from the obstructed vena cava, often without ' +
    'a pulse wave, so the column does not reflect right atrial pressure; read no CVP from it (common practice, no source).',
  'tense-ascites':
    'Tense ascites: raised abdominal and intrathoracic pressure can lift the column without raised filling pressure, ' +
    'and the abdominojugular test is unreliable (common practice, no source).',
}

/** The left brachiocephalic vein crosses behind the aortic arch: Shellenberger 2017, Cleve Clin J Med 84:943. */
export const LEFT_VEIN_CAUTION_TEXT =
  'Read on a left-sided vein: the left brachiocephalic vein can be compressed by the aorta, so the column may read ' +
  'falsely high; confirm on the right internal jugular where possible (Shellenberger 2017, Cleve Clin J Med).'

export function isLeftSided(vein: ExamFindings['vein']): boolean {
  return vein === 'left-internal' || vein === 'left-external'
}
