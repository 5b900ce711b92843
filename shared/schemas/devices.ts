// Shop devices and operators' PINs: the forms of the devices page and the sign-in page share these.
import { z } from 'zod'
import { PersonName } from './auth'

export const PIN_PATTERN = /^\d{4,8}$/

/** A PIN anyone would try first: one digit over and over, or a straight run up or down (1234, 8765). */
export function isObviousPin(pin: string): boolean {
  const digits = [...pin].map(Number)
  const steps = new Set(digits.slice(1).map((d, i) => d - digits[i]!))
  return steps.size === 1 && [0, 1, -1].includes([...steps][0]!)
}

export const Pin = z.string({ error: 'enter 4 to 8 digits' }).trim()
  .regex(PIN_PATTERN, { error: 'use 4 to 8 digits, nothing else' })
  .refine((pin) => !isObviousPin(pin), { error: 'choose digits that are not all the same or a straight run like 1234' })

export const DeviceName = z.string({ error: 'name this device, for example "Tablet by router 2"' }).trim()
  .min(1, { error: 'name this device, for example "Tablet by router 2"' })
  .max(60, { error: 'use at most 60 characters' })

export const EnrolDeviceBody = z.object({ name: DeviceName })

/** No PIN: the server makes one up and shows it once. */
export const SetPinBody = z.object({ pin: Pin.optional() })

export const AddOperatorBody = z.object({ name: PersonName, pin: Pin.optional() })

export const PinSignInBody = z.object({
  userId: z.number({ error: 'choose your name' }).int().positive().max(2_147_483_647),
  // Only the shape: an old obvious PIN must still get a plain "wrong PIN".
  pin: z.string({ error: 'enter your PIN' }).regex(PIN_PATTERN, { error: 'a PIN is 4 to 8 digits' }),
})
