// Inputs of purchase orders and deliveries, shared by the crib's forms and routes.
import { z } from 'zod'

// Ids are PostgreSQL integers: a larger number must be refused here, not fail in the database.
const Id = z.number().int().positive().max(2_147_483_647)
const Quantity = z.number({ error: 'enter a quantity' }).int({ error: 'must be a whole number' }).positive({ error: 'must be at least 1' }).max(10_000)

// Diameters are stored to 0.001 mm: anything smaller would round to 0 in the database.
const Diameter = z.number({ error: 'enter a diameter in mm' }).min(0.001, { error: 'must be at least 0.001 mm' }).max(200, { error: 'must be at most 200 mm' })

export const OrderIdParams = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

// A router bit costs tens of dollars; a unit price above $100,000 is a typing slip.
export const OrderLineInput = z.object({
  typeId: Id,
  quantity: Quantity,
  unitCostCents: z.number({ error: 'enter a price like 42.50' }).int({ error: 'must be whole cents' })
    .min(0, { error: 'cannot be negative' }).max(10_000_000, { error: 'must be at most 100000.00' }).optional(),
})

export const NewOrderBody = z.object({
  supplierId: Id,
  lines: z.array(OrderLineInput).min(1, { error: 'add at least one line' }).max(200),
  note: z.string().trim().max(2000).optional(),
})

export const FromSuggestionsBody = z.object({
  typeIds: z.array(Id).min(1, { error: 'choose at least one cutter type' }).max(500),
})

export const OrderUpdateBody = z.object({
  lines: z.array(OrderLineInput).min(1, { error: 'an order needs at least one line; cancel it instead' }).max(200).optional(),
  note: z.string().trim().max(2000).optional(),
})

export const ReceiveOrderBody = z.object({
  lines: z.array(z.object({
    lineId: Id,
    quantity: z.number().int().min(0).max(10_000),
    diameterMm: Diameter.optional(),
  })).min(1).max(200),
})

export const DeliveryBody = z.object({
  typeId: z.number({ error: 'choose a cutter type' }).int().positive().max(2_147_483_647),
  quantity: Quantity.max(500, { error: 'at most 500 at once' }),
  diameterMm: Diameter.optional(),
  note: z.string().trim().max(2000).optional(),
})
