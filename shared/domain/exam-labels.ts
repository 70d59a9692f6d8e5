import type { Exam, ExamStatus, NotAssessableReason, Vein, VenousSign } from '../schemas/exam.ts'

export const VEIN_LABEL: Record<Vein, string> = {
  'right-internal': 'right internal jugular',
  'left-internal': 'left internal jugular',
  'right-external': 'right external jugular',
  'left-external': 'left external jugular',
}

export const VENOUS_SIGN_LABEL: Record<VenousSign, string> = {
  'not-palpable': 'not palpable',
  'double-peaked': 'double-peaked',
  'falls-on-inspiration': 'falls on inspiration',
  'changes-with-position': 'changes with position',
  'rises-with-abdominal-pressure': 'rises with abdominal pressure',
  'obliterated-by-light-pressure': 'obliterated by light pressure',
}

/** What was found when a sign is absent, e.g. "palpable" for an absent "not palpable". */
export const VENOUS_SIGN_ABSENT_LABEL: Record<VenousSign, string> = {
  'not-palpable': 'palpable',
  'double-peaked': 'single-peaked',
  'falls-on-inspiration': 'no fall on inspiration',
  'changes-with-position': 'no change with position',
  'rises-with-abdominal-pressure': 'no rise with abdominal pressure',
  'obliterated-by-light-pressure': 'persists under light pressure',
}

export const STATUS_LABEL: Record<ExamStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  countersigned: 'Countersigned',
  returned: 'Returned',
}

export const NOT_ASSESSABLE_LABEL: Record<NotAssessableReason, string> = {
  habitus: 'body habitus',
  'lines-or-dressings': 'lines or dressings in the way',
  'cannot-position': 'the patient could not be positioned',
  ventilated: 'ventilated',
  agitated: 'agitated',
  other: 'other reason',
}

export const RESPIRATORY_TEXT: Record<Exam['respiratory'], string | null> = {
  'falls-on-inspiration': 'column falls on inspiration',
  'rises-on-inspiration': 'column rises on inspiration (Kussmaul sign)',
  'no-change': 'column unchanged with breathing',
  'not-assessed': null,
}

export const RHYTHM_TEXT: Record<Exam['rhythm'], string | null> = {
  sinus: 'sinus rhythm',
  'atrial-fibrillation': 'atrial fibrillation',
  paced: 'paced rhythm',
  other: 'other rhythm',
  unknown: null,
}
