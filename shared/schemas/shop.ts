// The shop's own settings, shared by the settings page and its route.
import { z } from 'zod'
import { isValidTimeZone } from '../kerf/report-schedule'
import { CURRENCIES } from '../kerf/money'
import { Email } from './auth'

const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v)

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
  holdingRate: z.number().min(0.001, { error: 'must be at least 0.1 %' }).max(5, { error: 'at most 500 %' }).optional(),
  // Printed on purchase orders and regrind batches: lines as typed, trailing spaces dropped.
  address: z.string({ error: 'enter the postal address' }).max(500, { error: 'use at most 500 characters' })
    .transform((s) => s.split(/\r?\n/).map((l) => l.trim()).filter(Boolean).join('\n')).optional(),
  phone: z.preprocess(blankToNull, z.string().trim().max(40, { error: 'use at most 40 characters' })
    .regex(/^[0-9+()./\- x]+$/i, { error: 'use digits, spaces and + ( ) - . only' }).nullish()),
  replyEmail: z.preprocess(blankToNull, Email.nullish()),
  currency: z.enum(CURRENCIES, { error: `choose one of ${CURRENCIES.join(', ')}` }).optional(),
})
