import { computed } from 'vue'
import { useTheme } from 'vuetify'
import { storeThemeName } from '@/plugins/themes'

/** Light/dark switch that remembers the choice in localStorage. */
export function useThemeToggle() {
  const theme = useTheme()
  const isDark = computed(() => theme.global.current.value.dark)

  function toggle() {
    const next = isDark.value ? 'plumblineLight' : 'plumblineDark'
    theme.change(next)
    storeThemeName(next)
  }

  return { isDark, toggle }
}
