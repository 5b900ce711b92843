// The shop's own settings, shared by the settings page and its route.
import { z } from 'zod'
import { isValidTimeZone } from '../kerf/report-schedule'
import { Email } from './auth'

export const ShopUpdateBody = z.object({
  name: z.string().trim().min(1, { error: 'enter the shop\'s name' }).max(120).optional(),
  timeZone: z.string().refine(isValidTimeZone, { error: 'not a time zone name (for example America/Chicago)' }).optional(),
  reportTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'use 24-hour time, for example 05:30' }).optional(),
  // null: every crib manager and owner.
  reportRecipients: z.array(Email).max(20, { error: 'at most 20 addresses' }).nullable().optional(),
  dailyAllClear: z.boolean().optional(),
  // Stored to 0.001 (0.1 %): a smaller figure would round to 0 in the database.
  lifeThreshold: z.number().min(0.001, { error: 'must be at least 0.1 %' }).max(1.5, { error: 'at most 150 %' }).optional(),
  regrindLifeFraction: z.number().min(0.001, { error: 'must be at least 0.1 %' }).max(1, { error: 'at most 100 %' }).optional(),
  orderCostCents: z.number().int().min(0).max(10_000_000).optional(),
  // The cut form asks before logging more minutes than one shift holds.
  shiftMinutes: z.number().int({ error: 'must be whole minutes' }).min(60, { error: 'must be at least 60 minutes' }).max(1440, { error: 'at most 1440 minutes (a day)' }).optional(),
  // Cents per hour of hand-finishing, for the cost of cleanup minutes; null: not set.
  labourRateCentsPerHour: z.number({ error: 'enter the labour rate' }).int({ error: 'must be whole cents' })
    .min(0, { error: 'must be 0 or more' }).max(1_000_000, { error: 'must be at most 10,000.00 an hour' }).nullable().optional(),
  holdingRate: z.number().min(0.001, { error: 'must be at least 0.1 %' }).max(5, { error: 'at most 500 %' }).optional(),
})
