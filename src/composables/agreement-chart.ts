import { computed } from 'vue'
import { useTheme } from 'vuetify'
import { CategoryScale, Chart, Legend, LinearScale, LineController, LineElement, PointElement, ScatterController, Tooltip } from 'chart.js'

// Only what the agreement charts draw, so the chunk carries no unused controllers. Imported by the lazy charts only.
Chart.register(ScatterController, LineController, PointElement, LineElement, LinearScale, CategoryScale, Legend, Tooltip)

/** The theme's colours for the charts, so they follow the light and dark themes. */
function useChartColors() {
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

/**
 * What every agreement chart shares: the registered chart.js parts, the theme's colours, and options with themed
 * axes (titled when given a title) and the legend below. components/chart/ChartFigure.vue gives each its caption.
 */
export function useAgreementChart(axisTitles: () => { x?: string; y?: string }) {
  const colors = useChartColors()
  // Plain values only (no scriptable options), so one object fits the scatter and the line charts alike.
  const options = computed(() => {
    const c = colors.value
    const axis = (title: string | undefined) => ({
      ...(title ? { title: { display: true, text: title, color: c.text } } : {}),
      ticks: { color: c.text },
      grid: { color: c.grid },
    })
    const { x, y } = axisTitles()
    return {
      responsive: true,
      maintainAspectRatio: false,
      animation: false as const,
      scales: { x: axis(x), y: axis(y) },
      plugins: {
        legend: { position: 'bottom' as const, labels: { color: c.text, usePointStyle: true, pointStyleWidth: 24, boxHeight: 8 } },
      },
    }
  })
  return { colors, options }
}
