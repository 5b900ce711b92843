// A calendar day as the routes take it ('2026-01-31', UTC). The ISO format alone admits the year
// 0000, which PostgreSQL's date type does not have (it fails there instead of here); no tooling
// record is older than 1900, so earlier days are refused with a message.
import { z } from 'zod'

export const EARLIEST_YEAR = 1900

export const Day = z.iso.date({ error: 'must be a date like 2026-01-31' })
  .refine((d) => Number(d.slice(0, 4)) >= EARLIEST_YEAR, { error: `must be a date in ${EARLIEST_YEAR} or later` })
