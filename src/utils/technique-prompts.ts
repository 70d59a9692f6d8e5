/**
 * Short reminders of bedside technique, each shown at the step of the flow where it matters; technique only, never a
 * finding or a diagnosis. The technique follows Applefeld 1990 (Clinical Methods, 3rd ed., ch. 19: position, tangential
 * light, end-expiration) and McGee 1998 (Am Heart J 136:10–18: the sternal angle as the reference); the wording is ours.
 */
export const TECHNIQUE_PROMPTS = [
  { code: 'head-supported', step: 0, text: 'Support the head on a pillow, turned slightly to the left, so the neck muscles are slack.' },
  { code: 'tangential-light', step: 1, text: 'Shine a light across the neck at a low angle: the pulsation shows as a moving shadow.' },
  { code: 'between-sternocleidomastoid', step: 1, text: 'Look for the internal jugular between the two heads of the sternocleidomastoid.' },
  { code: 'adjust-bed', step: 2, text: 'Adjust the bed until the top of the column is seen: lower it if there is no column, raise it if the top is out of sight.' },
  { code: 'end-expiration', step: 2, text: 'Read the height at end-expiration.' },
  { code: 'mean-level', step: 2, text: 'When the v waves are large, read the mean level of the column, not its peak.' },
] as const

export type TechniquePrompt = (typeof TECHNIQUE_PROMPTS)[number]

/** The prompts of one step that this device has not dismissed. */
export function promptsForStep(step: number, dismissed: readonly string[]): TechniquePrompt[] {
  return TECHNIQUE_PROMPTS.filter((prompt) => prompt.step === step && !dismissed.includes(prompt.code))
}
