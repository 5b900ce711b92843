// Durations as the operator reads and logs them: estimates in whole minutes, logs to a tenth.
/** "45 min", "2 h 05 min"; whole minutes, since the figure is an estimate. */
export function formatMinutes(minutes: number): string {
  const whole = Math.max(0, Math.round(minutes))
  if (whole < 60) return `${whole} min`
  const h = Math.floor(whole / 60)
  const m = whole % 60
  return m ? `${h} h ${String(m).padStart(2, '0')} min` : `${h} h`
}

/** A long total in whole hours ("44 h"), short enough for a small tile. */
export function formatTotalTime(minutes: number): string {
  return minutes < 60 ? `${Math.max(0, Math.round(minutes))} min` : `${Math.round(minutes / 60).toLocaleString('en')} h`
}

/** A logged duration as typed, without a trailing ".0": "12.5 min". */
export function formatLoggedMinutes(minutes: number): string {
  return `${trimTrailingZeros(minutes.toFixed(1))} min`
}

/** The minutes a timer has run, to a tenth, at least 0.1 (the server wants more than zero). */
export function timerMinutes(elapsedMs: number): number {
  return Math.max(0.1, Math.round(elapsedMs / 6_000) / 10)
}

function trimTrailingZeros(text: string): string {
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text
}

/** A running timer as a clock: "4:07", "1:02:30". */
export function formatElapsed(elapsedMs: number): string {
  const s = Math.max(0, Math.floor(elapsedMs / 1000))
  const h = Math.floor(s / 3600)
  const m = Math.floor((s % 3600) / 60)
  const sec = String(s % 60).padStart(2, '0')
  return h ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`
}
