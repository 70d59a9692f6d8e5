import type { ThemeDefinition } from 'vuetify'

const plumblineLight: ThemeDefinition = {
  dark: false,
  colors: {
    background: '#F4F1EC',
    surface: '#FBFAF7',
    'surface-variant': '#E4DFD7',
    primary: '#1F5C63',
    secondary: '#B3652B',
    error: '#A4262C',
    warning: '#A86B00',
    info: '#2F6690',
    success: '#3B7A47',
  },
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
