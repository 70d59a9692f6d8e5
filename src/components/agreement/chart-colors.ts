import { computed } from 'vue'
import { useTheme } from 'vuetify'

/** The theme's colours for the charts, so they follow the light and dark themes. */
export function useChartColors() {
  const theme = useTheme()
  return computed(() => {
    const { colors, dark } = theme.current.value
    // The themes declare hex strings (src/plugins/themes.ts); anything else falls back to a neutral grey.
    const color = (name: string) => {
      const value = (colors as Record<string, unknown>)[name]
      return typeof value === 'string' ? value : '#757575'
    }
    return {
      points: color('primary'),
      bias: color('secondary'),
      limits: color('error'),
      identity: color('info'),
      text: dark ? 'rgba(255,255,255,0.87)' : 'rgba(0,0,0,0.87)',
      grid: dark ? 'rgba(255,255,255,0.12)' : 'rgba(0,0,0,0.1)',
    }
  })
}
