export interface Point {
  x: number
  y: number
}

export interface DiagramGeometry {
  hip: Point
  sternalAngle: Point
  head: Point
  columnTop: Point
  ruleTop: Point
  arcEnd: Point
  viewBox: string
}

const PX_PER_CM = 8
const TRUNK_PX = 110
const NECK_PX = 64
const ARC_PX = 28
const PAD = 16

function along(from: Point, theta: number, px: number): Point {
  return { x: from.x + px * Math.cos(theta), y: from.y - px * Math.sin(theta) }
}

/** Distance along the trunk axis from the sternal angle to the column top, kept inside the drawing. */
function columnDistancePx(theta: number, verticalCm: number | null, alongNeckCm: number | null): number {
  const cm = alongNeckCm ?? (verticalCm === null ? 4 : verticalCm / Math.max(Math.sin(theta), 0.05))
  return Math.min(Math.max(cm * PX_PER_CM, -TRUNK_PX / 2), NECK_PX)
}

/**
 * Side view of the patient: hip on the bed, trunk at θ to the horizontal, the sternal angle on it, the neck beyond,
 * and a vertical rule at the sternal angle reaching above the column top.
 */
export function diagramGeometry(inclinationDeg: number, verticalCm: number | null, alongNeckCm: number | null): DiagramGeometry {
  const theta = (Math.min(Math.max(inclinationDeg, 0), 90) * Math.PI) / 180
  const hip = { x: 0, y: 0 }
  const sternalAngle = along(hip, theta, TRUNK_PX)
  const head = along(sternalAngle, theta, NECK_PX)
  const columnTop = along(sternalAngle, theta, columnDistancePx(theta, verticalCm, alongNeckCm))
  const ruleTop = { x: sternalAngle.x, y: Math.min(columnTop.y, sternalAngle.y) - 2 * PX_PER_CM }
  const arcEnd = along(hip, theta, ARC_PX)
  const points = [hip, head, columnTop, ruleTop, { x: hip.x + TRUNK_PX + NECK_PX, y: hip.y }]
  const minX = Math.min(...points.map((p) => p.x)) - PAD
  const minY = Math.min(...points.map((p) => p.y)) - PAD
  const maxX = Math.max(...points.map((p) => p.x)) + PAD
  const maxY = Math.max(...points.map((p) => p.y)) + PAD
  return { hip, sternalAngle, head, columnTop, ruleTop, arcEnd, viewBox: `${minX} ${minY} ${maxX - minX} ${maxY - minY}` }
}

export const DIAGRAM_PX_PER_CM = PX_PER_CM
