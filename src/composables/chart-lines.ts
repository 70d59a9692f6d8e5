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
