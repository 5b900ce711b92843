// Runs the nightly report task now, for every shop whose report time has come, exactly as the
// schedule does. Guarded by the task token from the configuration; without one it does not exist.
import { timingSafeEqual } from 'node:crypto'

export default defineEventHandler(async (event) => {
  const { taskToken } = useRuntimeConfig(event)
  if (!taskToken) throw createError({ statusCode: 404, statusMessage: 'Not found.' })
  const given = Buffer.from((getRequestHeader(event, 'authorization') ?? '').replace(/^Bearer\s+/i, ''))
  const wanted = Buffer.from(taskToken)
  if (given.length !== wanted.length || !timingSafeEqual(given, wanted)) {
    throw createError({ statusCode: 401, statusMessage: 'Send the task token as "Authorization: Bearer <token>".' })
  }
  const { result } = await runTask('report:nightly')
  return result
})
