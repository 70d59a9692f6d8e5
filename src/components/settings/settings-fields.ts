import { DEFAULT_APP_SETTINGS, PAIR_WINDOW_MINUTES, REFERENCE_WINDOW_MINUTES, type AppSettings } from '#shared/schemas/settings'
import type { OffsetModel } from '#shared/schemas/exam'

/** A numeric setting as the admin screen shows it; `path` is also the key of its field error. */
/** The numeric settings that sit at the top level of the settings rather than under `estimate`. */
type WindowPath = 'pairWindowMinutes' | 'referenceWindowMinutes'
const WINDOW_PATHS: readonly string[] = ['pairWindowMinutes', 'referenceWindowMinutes'] satisfies WindowPath[]
const isWindow = (path: string): path is WindowPath => WINDOW_PATHS.includes(path)

export interface NumberSetting {
  path: `estimate.${keyof AppSettings['estimate']}` | WindowPath
  label: string
  unit: string
  step: number
  /** Where the default comes from: a published source, or a product default. */
  source: string
}

export interface SettingGroup {
  title: string
  description: string
  fields: NumberSetting[]
}

export const SETTING_GROUPS: SettingGroup[] = [
  {
    title: 'Interpretation thresholds',
    description: 'How an estimate is worded: elevated or not, and which CVP range it falls in.',
    fields: [
      { path: 'estimate.elevatedAboveCm', label: 'JVP elevated above', unit: 'cm above the sternal angle', step: 0.5, source: 'McGee 1998, Am Heart J 136:10–18' },
      { path: 'estimate.lowBelowCmH2O', label: 'Low CVP below', unit: 'cmH₂O', step: 0.5, source: 'categories used by Cook 1990' },
      { path: 'estimate.highAboveCmH2O', label: 'High CVP above', unit: 'cmH₂O', step: 0.5, source: 'categories used by Cook 1990' },
      { path: 'estimate.minVenousSigns', label: 'Venous signs needed to drop the arterial warning', unit: 'signs of 6', step: 1, source: 'signs from Cook & Simel 1996, JAMA 275:630–634; the count is a product default' },
    ],
  },
  {
    title: 'Error band',
    description: 'The terms of σ in the 95% band, CVP ± 1.96·σ.',
    fields: [
      { path: 'estimate.sigmaReadRulerCm', label: 'Reading error with a ruler (σ)', unit: 'cm', step: 0.1, source: 'product default, no published source' },
      { path: 'estimate.sigmaReadVisualCm', label: 'Reading error by eye (σ)', unit: 'cm', step: 0.1, source: 'product default, no published source' },
      { path: 'estimate.sigmaOffsetCm', label: 'Offset error up to 60° (σ)', unit: 'cm', step: 0.1, source: 'Seth 2002: supine IQR 4.7–6.1 cm ÷ 1.349' },
      { path: 'estimate.sigmaOffsetOutsideRangeCm', label: 'Offset error above 60° (σ)', unit: 'cm', step: 0.1, source: 'product default beyond the angles Seth 2002 measured' },
      { path: 'estimate.sigmaObserverCm', label: 'Observer error until enough local pairs (σ)', unit: 'cm', step: 0.1, source: 'product default; replaced by the local spread once there are 30 pairs in a year' },
    ],
  },
  {
    title: 'Agreement',
    description: 'Which exams of one patient by two examiners count as a pair, and which measured pressure pairs with an exam.',
    fields: [
      { path: 'pairWindowMinutes', label: 'Pairing window', unit: 'minutes', step: 5, source: `product default, between ${PAIR_WINDOW_MINUTES.min} and ${PAIR_WINDOW_MINUTES.max}` },
      {
        path: 'referenceWindowMinutes',
        label: 'Reference window (measured pressure to exam)',
        unit: 'minutes',
        step: 5,
        source: `product default, between ${REFERENCE_WINDOW_MINUTES.min} and ${REFERENCE_WINDOW_MINUTES.max}`,
      },
    ],
  },
]

export const OFFSET_MODEL_CHOICES: { value: OffsetModel; title: string }[] = [
  { value: 'incline-adjusted', title: 'Incline-adjusted (Seth 2002)' },
  { value: 'fixed-5cm', title: 'Fixed 5 cm (classical rule)' },
]

const OTHER_LABELS: Record<string, string> = { defaultOffsetModel: 'Default offset model', photosAllowed: 'Photos allowed' }

const estimateKey = (path: NumberSetting['path']) => path.slice('estimate.'.length) as keyof AppSettings['estimate']

/** A setting's value by its path. */
export function valueAt(values: AppSettings, path: NumberSetting['path']): number {
  return isWindow(path) ? values[path] : values.estimate[estimateKey(path)]
}

/** A copy of the settings with one numeric value replaced (null while the field is empty). */
export function withValueAt(values: AppSettings, path: NumberSetting['path'], value: number | null): AppSettings {
  if (isWindow(path)) return { ...values, [path]: value as number }
  return { ...values, estimate: { ...values.estimate, [estimateKey(path)]: value } }
}

export function defaultText(field: NumberSetting): string {
  return `Default ${valueAt(DEFAULT_APP_SETTINGS, field.path)} ${field.unit} (${field.source})`
}

/** A changed setting in words, for the history and the confirmation. */
export function changeText(path: string, change: { from: unknown; to: unknown }): string {
  const field = SETTING_GROUPS.flatMap((g) => g.fields).find((f) => f.path === path)
  const show = (v: unknown) => (typeof v === 'boolean' ? (v ? 'yes' : 'no') : (OFFSET_MODEL_CHOICES.find((c) => c.value === v)?.title ?? String(v)))
  const label = field?.label ?? OTHER_LABELS[path] ?? path
  return `${label}: ${show(change.from)} → ${show(change.to)}${field ? ` ${field.unit}` : ''}`
}
