// Vuetify's reset, utility and colour classes (`text-white`, `bg-transparent`); each component's own stylesheet
// comes with the component (vite-plugin-vuetify autoImport), so a page loads only the components it uses.
import 'vuetify/styles'
// vite.config.ts cuts this stylesheet down to the icons the sources name and to its woff2 copy.
import '@mdi/font/css/materialdesignicons.css'
// Latin and Latin Extended only, at the weights Vuetify's type scale and our classes use (400, 500, 700); each
// face has `font-display: swap`, so text shows in a fallback font until Roboto arrives.
import '@fontsource/roboto/latin-400.css'
import '@fontsource/roboto/latin-ext-400.css'
import '@fontsource/roboto/latin-500.css'
import '@fontsource/roboto/latin-ext-500.css'
import '@fontsource/roboto/latin-700.css'
import '@fontsource/roboto/latin-ext-700.css'
import { createVuetify } from 'vuetify'
import { plumblineThemes, storedThemeName } from './themes'

export default createVuetify({
  icons: { defaultSet: 'mdi' },
  theme: { defaultTheme: storedThemeName(), themes: plumblineThemes },
})
