// Inputs of the material routes, shared with the crib's material form.
import { z } from 'zod'
import { FAMILY_LABELS, MATERIAL_FAMILIES } from '../kerf/materials'

/** A starting wear factor: from a twentieth to twenty times the reference material's wear. */
export const WEAR_FACTOR_MIN = 0.05
export const WEAR_FACTOR_MAX = 20

export const MaterialFields = z.object({
  name: z.string({ error: 'enter a name' }).trim().min(1, { error: 'enter a name' }).max(80, { error: 'use at most 80 characters' }),
  family: z.enum(MATERIAL_FAMILIES, { error: `choose one of: ${Object.values(FAMILY_LABELS).join(', ').toLowerCase()}` }),
  // Stored to 0.001.
  wearFactor: z.number({ error: 'enter the wear factor, for example 1.2' })
    .min(WEAR_FACTOR_MIN, { error: `must be ${WEAR_FACTOR_MIN} to ${WEAR_FACTOR_MAX} (1 wears like the reference material)` })
    .max(WEAR_FACTOR_MAX, { error: `must be ${WEAR_FACTOR_MIN} to ${WEAR_FACTOR_MAX} (1 wears like the reference material)` }),
  /** Shown with remaining minutes on the cutter page. */
  common: z.boolean({ error: 'must be true or false' }).optional(),
})
export const MaterialBody = MaterialFields
export const MaterialUpdateBody = MaterialFields.partial()
export const MaterialListQuery = z.object({
  retired: z.enum(['include', 'exclude']).default('exclude'),
})
