import type { ThemeDefinition } from 'vuetify'

// Text on each colour is set here rather than left to Vuetify's guess, which put white on the dark theme's pale
// colours. Every pair reaches WCAG 2.1 AA contrast (SC 1.4.3, 4.5:1 for body text), as do the colours themselves
// as text on the background and surface; tests/client/plugins/themes.test.ts checks both.
const NAMED_COLOURS = ['primary', 'secondary', 'error', 'warning', 'info', 'success'] as const

function textOn(ink: string): Record<string, string> {
  return Object.fromEntries(NAMED_COLOURS.map((name) => [`on-${name}`, ink]))
}

const plumblineLight: ThemeDefinition = {
  dark: false,
  colors: {
    background: '#F4F1EC',
    surface: '#FBFAF7',
    'surface-variant': '#E4DFD7',
    primary: '#1F5C63',
    secondary: '#9E5620',
    error: '#A4262C',
    warning: '#8F5B00',
    info: '#2F6690',
    success: '#3B7A47',
    ...textOn('#FFFFFF'),
  },
  // Field labels are drawn at this opacity over the field's text colour (0.87): Vuetify's 0.60 left them at 3.9:1 on
  // the filled field, under WCAG 2.1 AA's 4.5:1 (SC 1.4.3).
  variables: { 'medium-emphasis-opacity': 0.68 },
}

const plumblineDark: ThemeDefinition = {
  dark: true,
  colors: {
    background: '#1C1B19',
    surface: '#262422',
    'surface-variant': '#3A3733',
    primary: '#6FB3BA',
    secondary: '#E09A62',
    error: '#F08A8E',
    warning: '#E8B35A',
    info: '#8CB8DB',
    success: '#8CC79A',
    ...textOn('#121212'),
  },
}

export const plumblineThemes = { plumblineLight, plumblineDark }
export type ThemeName = keyof typeof plumblineThemes

const STORAGE_KEY = 'plumbline.theme'

export function storedThemeName(): ThemeName {
  return localStorage.getItem(STORAGE_KEY) === 'plumblineDark' ? 'plumblineDark' : 'plumblineLight'
}

export function storeThemeName(name: ThemeName) {
  localStorage.setItem(STORAGE_KEY, name)
}
