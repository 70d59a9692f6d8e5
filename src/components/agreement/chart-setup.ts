import { CategoryScale, Chart, Legend, LinearScale, LineController, LineElement, PointElement, ScatterController, Tooltip } from 'chart.js'

// Only what the agreement charts draw, so the chunk carries no unused controllers. Imported by the lazy charts only.
Chart.register(ScatterController, LineController, PointElement, LineElement, LinearScale, CategoryScale, Legend, Tooltip)

export { Chart }
