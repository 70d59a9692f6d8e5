import 'vuetify/styles'
import '@mdi/font/css/materialdesignicons.css'
import '@fontsource/roboto/400.css'
import '@fontsource/roboto/500.css'
import '@fontsource/roboto/700.css'
import { createVuetify } from 'vuetify'
import { plumblineThemes, storedThemeName } from './themes'

export default createVuetify({
  icons: { defaultSet: 'mdi' },
  theme: { defaultTheme: storedThemeName(), themes: plumblineThemes },
})
