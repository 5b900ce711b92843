// Time and geometry of one move of an NC program: the trapezoidal speed profile and the length of
// arcs and helices. Pure.

/** Minutes a move of `lengthMm` takes at `feedMmPerMin` when the machine starts and stops it at
 *  `accelMmPerS2` (a trapezoidal speed profile: accelerate, cruise, decelerate). A move shorter
 *  than v²/a never reaches full feed and takes 2·√(L/a) (a triangle). Kinematics of constant
 *  acceleration, as in any mechanics text. */
export function trapezoidMinutes(lengthMm: number, feedMmPerMin: number, accelMmPerS2: number): number {
  if (!(lengthMm > 0)) return 0
  const v = feedMmPerMin / 60
  if (!(accelMmPerS2 > 0) || !Number.isFinite(accelMmPerS2)) return lengthMm / feedMmPerMin
  const rampDistance = (v * v) / accelMmPerS2
  const seconds = lengthMm >= rampDistance ? lengthMm / v + v / accelMmPerS2 : 2 * Math.sqrt(lengthMm / accelMmPerS2)
  return seconds / 60
}

const TAU = 2 * Math.PI

/** The angle swept from start to end about a centre, in radians, positive: counter-clockwise
 *  when `ccw`, else clockwise, in the plane's own (first, second) axes. End on start is a full
 *  circle; `turns` > 1 adds whole turns (the P word). */
export function sweepAngle(
  a0: number, b0: number, a1: number, b1: number, ca: number, cb: number, ccw: boolean, turns = 1,
): number {
  const start = Math.atan2(b0 - cb, a0 - ca)
  const end = Math.atan2(b1 - cb, a1 - ca)
  let sweep = ccw ? end - start : start - end
  while (sweep < 0) sweep += TAU
  while (sweep >= TAU) sweep -= TAU
  if (sweep < 1e-9) sweep = TAU
  return sweep + TAU * (Math.max(1, Math.floor(turns)) - 1)
}

/** Length along an arc of radius r sweeping `sweep` radians while the third axis travels
 *  `axisTravel`: √((r·θ)² + h²), a helix when h ≠ 0. */
export function helixLength(radius: number, sweep: number, axisTravel: number): number {
  const arc = radius * sweep
  return axisTravel === 0 ? arc : Math.hypot(arc, axisTravel)
}

/** Whether an arc starting at `startAngle` and sweeping `sweep` radians (counter-clockwise when
 *  `ccw`) passes through the direction `angle`: used to find the deepest point of an arc that
 *  stands in a vertical plane, which may lie between its end points. */
export function arcPassesAngle(startAngle: number, sweep: number, ccw: boolean, angle: number): boolean {
  if (sweep >= TAU) return true
  let to = ccw ? angle - startAngle : startAngle - angle
  while (to < 0) to += TAU
  while (to >= TAU) to -= TAU
  return to <= sweep
}
