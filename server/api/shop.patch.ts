// The owner changes the shop's settings.
import { ShopUpdateBody } from '#shared/schemas/shop'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const b = await readValidatedBody(event, parseWith(ShopUpdateBody))
  if (b.timeZone !== undefined) await assertKnownTimeZone(useDb(), b.timeZone)
  const set = {
    ...(b.name !== undefined && { name: b.name }),
    ...(b.timeZone !== undefined && { time_zone: b.timeZone }),
    ...(b.reportTime !== undefined && { report_time: b.reportTime }),
    ...(b.reportRecipients !== undefined && { report_recipients: b.reportRecipients?.length ? b.reportRecipients : null }),
    ...(b.dailyAllClear !== undefined && { daily_all_clear: b.dailyAllClear }),
    ...(b.lifeThreshold !== undefined && { life_threshold: b.lifeThreshold }),
    ...(b.shiftMinutes !== undefined && { shift_minutes: b.shiftMinutes }),
    ...(b.regrindLifeFraction !== undefined && { regrind_life_fraction: b.regrindLifeFraction }),
    ...(b.orderCostCents !== undefined && { order_cost_cents: b.orderCostCents }),
    ...(b.holdingRate !== undefined && { holding_rate: b.holdingRate }),
    ...(b.labourRateCentsPerHour !== undefined && { labour_rate_cents_per_hour: b.labourRateCentsPerHour }),
    ...(b.address !== undefined && { address: b.address }),
    ...(b.phone !== undefined && { phone: b.phone }),
    ...(b.replyEmail !== undefined && { reply_email: b.replyEmail }),
    ...(b.currency !== undefined && { currency: b.currency }),
  }
  if (Object.keys(set).length) await useDb().updateTable('shops').set(set).where('id', '=', owner.shopId).execute()
  return shopSettings(useDb(), owner.shopId)
})
