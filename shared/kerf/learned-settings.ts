// The learned nudge: when the shop's own cut logs for one cutter type in one material record
// melted or fuzzy cuts at known settings, what the clean cuts of the same pair ran at. Pure.
import { chipLoadOf } from './feeds'
import { MM_PER_INCH } from './units'

export interface LoggedSettings {
  outcome: 'clean' | 'melted' | 'chip_out' | 'fuzzy' | 'broken'
  rpm: number | null
  feedMmPerMin: number | null
}

export interface SettingsSummary {
  count: number
  rpm: number
  feedMmPerMin: number
  feedInPerMin: number
  chipLoadMm: number
}

export interface LearnedNudge {
  /** Melted or fuzzy cuts with rpm and feed recorded, and their middle settings. */
  bad: SettingsSummary
  /** Clean cuts with rpm and feed recorded; null when there are none yet. */
  clean: SettingsSummary | null
}

export const BAD_OUTCOMES = ['melted', 'fuzzy'] as const

/** The middle value (the mean of the middle two for an even count). */
export function median(values: readonly number[]): number {
  if (!values.length) throw new RangeError('median of nothing')
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

function summary(logs: readonly { rpm: number, feedMmPerMin: number }[], flutes: number): SettingsSummary {
  const feed = median(logs.map((l) => l.feedMmPerMin))
  return {
    count: logs.length,
    rpm: Math.round(median(logs.map((l) => l.rpm))),
    feedMmPerMin: Math.round(feed * 10) / 10,
    feedInPerMin: Math.round((feed / MM_PER_INCH) * 10) / 10,
    // Each log's own chip load, then the middle one: rpm and feed medians may come from different logs.
    chipLoadMm: Math.round(median(logs.map((l) => chipLoadOf(l.feedMmPerMin, l.rpm, flutes))) * 10000) / 10000,
  }
}

/** Medians rather than means: one log typed with a stray zero should not move the nudge.
 *  Null when no melted or fuzzy cut with settings is on record: then there is nothing to nudge. */
export function learnedNudge(logs: readonly LoggedSettings[], flutes: number): LearnedNudge | null {
  const withSettings = logs.filter((l): l is LoggedSettings & { rpm: number, feedMmPerMin: number } =>
    l.rpm !== null && l.rpm > 0 && l.feedMmPerMin !== null && l.feedMmPerMin > 0)
  const bad = withSettings.filter((l) => (BAD_OUTCOMES as readonly string[]).includes(l.outcome))
  if (!bad.length) return null
  const clean = withSettings.filter((l) => l.outcome === 'clean')
  return { bad: summary(bad, flutes), clean: clean.length ? summary(clean, flutes) : null }
}
