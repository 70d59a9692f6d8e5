// Vuetify's reset, utility and colour classes (`text-white`, `bg-transparent`); each component's own stylesheet
// comes with the component (vite-plugin-vuetify autoImport), so a page loads only the components it uses.
import 'vuetify/styles'
// vite.config.ts cuts this stylesheet down to the icons the sources name and to its woff2 copy.
import '@mdi/font/css/materialdesignicons.css'
// Latin and Latin Extended only, each face fetched only for the characters it holds.
import './roboto.css'
import { createVuetify } from 'vuetify'
import { plumblineThemes, storedThemeName } from './themes'

export default createVuetify({
  icons: { defaultSet: 'mdi' },
  theme: { defaultTheme: storedThemeName(), themes: plumblineThemes },
})
