// The bit chooser's answer (GET /api/bit-choice), typed from the route itself.
import type { InternalApi } from 'nitropack/types'
import type { BitChoiceQueryInput } from '#shared/schemas/bit-choice'

export type BitChoice = InternalApi['/api/bit-choice']['get'][number]

/** Asks for the ranking of one job; the caller shows the server's message on a 4xx. */
export function fetchBitChoice(query: BitChoiceQueryInput) {
  const q = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== null && v !== ''))
  return $fetch<BitChoice[]>('/api/bit-choice', { query: q })
}
