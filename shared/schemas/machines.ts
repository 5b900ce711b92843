// Inputs of the machine routes, shared with the crib's machine form.
import { z } from 'zod'

export const SPINDLE_RPM_MIN = 1000
export const SPINDLE_RPM_MAX = 100_000
export const POCKETS_MAX = 99

const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v)

const Rpm = (what: string) => z.number({ error: `enter the ${what} spindle speed in rpm` })
  .int({ error: 'must be a whole number of rpm' })
  .min(SPINDLE_RPM_MIN, { error: `must be ${SPINDLE_RPM_MIN} to ${SPINDLE_RPM_MAX} rpm` })
  .max(SPINDLE_RPM_MAX, { error: `must be ${SPINDLE_RPM_MIN} to ${SPINDLE_RPM_MAX} rpm` })
const BedMm = z.number({ error: 'enter a length in mm' })
  .min(0.1, { error: 'must be at least 0.1 mm' }).max(100_000, { error: 'must be at most 100000 mm' })

export const MachineFields = z.object({
  name: z.string({ error: 'enter a name' }).trim().min(1, { error: 'enter a name' }).max(80, { error: 'use at most 80 characters' }),
  description: z.string().trim().max(500, { error: 'use at most 500 characters' }).optional(),
  minRpm: Rpm('lowest'),
  maxRpm: Rpm('highest'),
  /** 0: a manual collet holding one cutter at a time. */
  pockets: z.number({ error: 'enter the number of tool-changer pockets (0 for a manual collet)' })
    .int({ error: 'must be a whole number' })
    .min(0, { error: `must be 0 (manual collet) to ${POCKETS_MAX}` })
    .max(POCKETS_MAX, { error: `must be 0 (manual collet) to ${POCKETS_MAX}` }),
  spindlePowerKw: z.preprocess(blankToNull, z.number({ error: 'enter the power in kW' })
    .min(0.01, { error: 'must be at least 0.01 kW' }).max(1000, { error: 'must be at most 1000 kW' }).nullish()),
  bedXMm: z.preprocess(blankToNull, BedMm.nullish()),
  bedYMm: z.preprocess(blankToNull, BedMm.nullish()),
})
export type MachineInput = z.input<typeof MachineFields>

/** The rule between the two speeds (the database has the matching CHECK). */
export function rpmProblems(minRpm: number, maxRpm: number): Record<string, string> {
  return minRpm < maxRpm ? {} : { maxRpm: 'must be higher than the lowest speed' }
}

export const MachineBody = MachineFields.superRefine((m, ctx) => {
  for (const [field, message] of Object.entries(rpmProblems(m.minRpm, m.maxRpm))) ctx.addIssue({ code: 'custom', path: [field], message })
})
/** A change to some fields; the route checks the speeds on the row as it will be. */
export const MachineUpdateBody = MachineFields.partial()

export const MachineListQuery = z.object({
  /** Retired machines too (the crib's machine page shows them). */
  retired: z.enum(['include', 'exclude']).default('exclude'),
})
