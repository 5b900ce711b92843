// Adopt learned wear factors (server/utils/insights/wear.ts): the chosen materials' factors become
// the fit's figures, recorded with who and when; past cut logs keep their own factor; a figure
// whose 90 % interval is wide is adopted only when the body confirms it (409 otherwise).
import { AdoptWearBody } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(AdoptWearBody))
  return adoptWearFactors(useDb(), user, body)
})
