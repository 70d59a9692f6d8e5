/** A straight line across a scatter chart, drawn without points and shown in the legend as a line. */
export function straightLine(label: string, from: { x: number; y: number }, to: { x: number; y: number }, color: string, dash: number[] = []) {
  return {
    label,
    data: [from, to],
    showLine: true,
    borderColor: color,
    backgroundColor: color,
    borderWidth: 2,
    borderDash: dash,
    pointRadius: 0,
    pointStyle: 'line' as const,
  }
}

/** The line of identity (y = x) across the range of every x and y shown, for a scatter of two measures of one thing. */
export function identityLine(label: string, points: readonly { x: number; y: number }[], color: string) {
  const values = points.flatMap((p) => [p.x, p.y])
  const [low, high] = values.length ? [Math.min(...values), Math.max(...values)] : [0, 1]
  return straightLine(label, { x: low, y: low }, { x: high, y: high }, color)
}
