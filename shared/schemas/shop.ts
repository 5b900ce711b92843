// The shop's own settings, shared by the settings page and its route.
import { z } from 'zod'
import { isValidTimeZone } from '../kerf/report-schedule'
import { CURRENCIES } from '../kerf/money'
import { Email } from './auth'

export const LIFE_THRESHOLD_FLOOR = 0.5
export const REGRIND_FRACTION_FLOOR = 0.1
const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v)

export const ShopUpdateBody = z.object({
  name: z.string().trim().min(1, { error: 'enter the shop\'s name' }).max(120).optional(),
  timeZone: z.string().refine(isValidTimeZone, { error: 'not a time zone name (for example America/Chicago)' }).optional(),
  reportTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'use 24-hour time, for example 05:30' }).optional(),
  // null: every crib manager and owner.
  reportRecipients: z.array(Email).max(20, { error: 'at most 20 addresses' }).nullable().optional(),
  dailyAllClear: z.boolean().optional(),
  // Fractions, stored to 0.001 (0.1 %). The floors keep a slip of the finger (0.9 typed as a
  // percentage) from making every cutter due at once or every regrind worthless.
  lifeThreshold: z.number({ error: 'enter a percentage like 90' }).min(LIFE_THRESHOLD_FLOOR, { error: `must be at least ${LIFE_THRESHOLD_FLOOR * 100} %: below that, cutters would go for resharpening with half their life left` })
    .max(1.5, { error: 'at most 150 %' }).optional(),
  regrindLifeFraction: z.number({ error: 'enter a percentage like 80' }).min(REGRIND_FRACTION_FLOOR, { error: `must be at least ${REGRIND_FRACTION_FLOOR * 100} %: a regrind that gives back less is not worth buying` })
    .max(1, { error: 'at most 100 %' }).optional(),
  orderCostCents: z.number({ error: 'enter an amount like 25.00' }).int().min(0).max(10_000_000, { error: 'must be at most 100000.00' }).optional(),
  // The cut form asks before logging more minutes than one shift holds.
  shiftMinutes: z.number().int({ error: 'must be whole minutes' }).min(60, { error: 'must be at least 60 minutes' }).max(1440, { error: 'at most 1440 minutes (a day)' }).optional(),
  // Cents per hour of hand-finishing, for the cost of cleanup minutes; null: not set.
  labourRateCentsPerHour: z.number({ error: 'enter the labour rate' }).int({ error: 'must be whole cents' })
    .min(0, { error: 'must be 0 or more' }).max(1_000_000, { error: 'must be at most 10,000.00 an hour' }).nullable().optional(),
  holdingRate: z.number({ error: 'enter a percentage like 25' }).min(0.001, { error: 'must be at least 0.1 %' }).max(5, { error: 'at most 500 %' }).optional(),
  // Printed on purchase orders and regrind batches: lines as typed, trailing spaces dropped.
  address: z.string({ error: 'enter the postal address' }).max(500, { error: 'use at most 500 characters' })
    .transform((s) => s.split(/\r?\n/).map((l) => l.trim()).filter(Boolean).join('\n')).optional(),
  phone: z.preprocess(blankToNull, z.string().trim().max(40, { error: 'use at most 40 characters' })
    .regex(/^[0-9+()./\- x]+$/i, { error: 'use digits, spaces and + ( ) - . only' }).nullish()),
  replyEmail: z.preprocess(blankToNull, Email.nullish()),
  currency: z.enum(CURRENCIES, { error: `choose one of ${CURRENCIES.join(', ')}` }).optional(),
})
