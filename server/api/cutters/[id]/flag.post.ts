// Flag a cutter dull (it comes out of the spindle and waits in the crib for resharpening) or
// broken (it is retired). Multipart with an optional photo taken on the phone, or plain JSON.
import { CutterIdParams, FlagFields, PHOTO_MAX_BYTES } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))

  let fields: unknown
  let photo: { data: Buffer, filename?: string } | undefined
  if ((getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')) {
    const parts = (await readMultipartFormData(event)) ?? []
    fields = Object.fromEntries(parts.filter((p) => !p.filename && p.name && p.name !== 'photo').map((p) => [p.name, p.data.toString('utf8')]))
    const file = parts.find((p) => p.name === 'photo')
    if (file && (file.filename || file.data.length)) photo = { data: file.data, filename: file.filename }
  } else {
    fields = await readBody(event)
  }
  const { kind, note } = validateInput(FlagFields, fields ?? {})

  return {
    cutter: await changeCutter(user, id, async (cutter, tx) => {
      if (cutter.status !== 'in_crib' && cutter.status !== 'in_spindle') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: only a cutter in the crib or a machine can be flagged.` })
      }
      const upload = photo ? await storePhoto(tx, { shopId: user.shopId, userId: user.id, maxBytes: PHOTO_MAX_BYTES, ...photo }) : undefined
      const to = kind === 'dull' ? 'in_crib' : 'retired'
      return {
        set: { status: to, machine_id: null, flagged: kind, flagged_at: new Date(), ...(kind === 'broken' && { retired_reason: 'broken' as const }) },
        event: { kind: kind === 'dull' ? 'flagged_dull' : 'flagged_broken', to, machineId: cutter.machine_id, note, photoId: upload?.id },
      }
    }),
  }
})
