// Logging a run of a program: one cut log per tool, against the cutter in that tool's pocket, in
// the chosen material, for the acceleration-aware estimate × repeats (or the operator's
// adjustment), with the tool's outcome and any cleanup minutes per part, through the same logCut()
// (server/utils/spindle/cuts.ts) as a cut logged by hand. Each tool's log has the key
// "<run key>:T<tool>", so a double tap or a retry logs each tool once; the run row and its list of
// logs are written with ON CONFLICT DO NOTHING, so a retry after a failure part way finishes the
// run instead of starting a second one.
import type { z } from 'zod'
import type { CutOutcome } from '#shared/kerf/spindle'
import type { RunBody } from '#shared/schemas/programs'
import type { SessionUser } from '../platform/auth'

export async function logRun(user: SessionUser, programId: number, body: z.output<typeof RunBody>) {
  const db = useDb()
  const check = await checkBeforeJob(db, user.shopId, programId, body)
  const tools = new Set(check.tools.map((t) => t.tool))
  for (const a of body.adjust ?? []) {
    if (!tools.has(a.tool)) badField('adjust', `the program calls no tool T${a.tool}`)
  }

  const findRun = () => db.selectFrom('nc_runs').select(['id', 'program_id', 'repeats', 'job_ref'])
    .where('shop_id', '=', user.shopId).where('idempotency_key', '=', body.idempotencyKey).executeTakeFirst()
  let run = await findRun()
  const replay = !!run
  const done = new Map(run
    ? (await db.selectFrom('nc_run_logs').select(['tool', 'cut_log_id']).where('shop_id', '=', user.shopId).where('run_id', '=', run.id).execute()).map((r) => [r.tool, r.cut_log_id])
    : [])
  if (run && run.program_id !== programId) {
    throw createError({ statusCode: 409, statusMessage: 'This idempotency key was already used for a run of another program. Send the run with a new key.' })
  }
  // Refused before anything is written: a tool whose pocket is empty.
  const empty = check.tools.filter((t) => !t.cutter && !done.has(t.tool))
  if (empty.length) {
    throw createError({
      statusCode: 409,
      statusMessage: `${empty.map((t) => `T${t.tool} (pocket ${t.pocket})`).join(', ')} ${empty.length === 1 ? 'has' : 'have'} no cutter in ${check.machine.name}: load ${empty.length === 1 ? 'one' : 'them'} and log the run again.`,
    })
  }
  run ??= await db.insertInto('nc_runs').values({
    shop_id: user.shopId, program_id: programId, machine_id: body.machineId, material_id: body.materialId, repeats: body.repeats,
    job_ref: body.jobRef ?? '', operator_id: user.id, idempotency_key: body.idempotencyKey,
  }).onConflict((oc) => oc.columns(['shop_id', 'idempotency_key']).doNothing())
    .returning(['id', 'program_id', 'repeats', 'job_ref']).executeTakeFirst()
    // A retry racing its first try: the other one wrote the run; carry on with it.
    ?? await findRun()
  if (!run) throw createError({ statusCode: 409, statusMessage: 'The run could not be recorded; send it again with the same key.' })

  const cutAt = new Date().toISOString()
  const logs = []
  for (const t of check.tools) {
    const adjust = body.adjust?.find((a) => a.tool === t.tool)
    const minutes = adjust?.minutes ?? Math.max(0.01, Math.round(t.minutesNeeded * 100) / 100)
    if (minutes > 1440) badField('repeats', `T${t.tool} would log ${Math.round(minutes)} minutes and one log holds at most 1440: log the run in parts`)
    const outcome: CutOutcome = adjust?.outcome ?? 'clean'
    const earlierLog = done.get(t.tool)
    const cutterId = earlierLog
      ? (await db.selectFrom('cut_logs').select('cutter_id').where('shop_id', '=', user.shopId).where('id', '=', earlierLog).executeTakeFirstOrThrow()).cutter_id
      : t.cutter!.id
    const rpm = t.spindleRpm.length ? Math.min(100_000, Math.round(Math.max(...t.spindleRpm))) : null
    const feed = t.feedsMmPerMin.length ? Math.max(...t.feedsMmPerMin) : null
    const result = await logCut(db, user, cutterId, {
      idempotencyKey: `${body.idempotencyKey}:T${t.tool}`, materialId: body.materialId, machineId: body.machineId, minutes, outcome,
      cleanupMinutesPerPart: adjust?.cleanupMinutesPerPart ?? null,
      rpm: rpm && rpm > 0 ? rpm : null, feedMmPerMin: feed && feed > 0 ? Math.min(feed, 1_000_000) : null, cutAt,
      note: `Program ${check.program.name}, T${t.tool}, ${body.repeats} ${body.repeats === 1 ? 'repeat' : 'repeats'}${run.job_ref ? `, job ${run.job_ref}` : ''}`,
    })
    await db.insertInto('nc_run_logs').values({ shop_id: user.shopId, run_id: run.id, tool: t.tool, cut_log_id: result.log.id })
      .onConflict((oc) => oc.doNothing()).execute()
    logs.push({
      tool: t.tool, pocket: t.pocket, cutterId, cutterCode: result.cutter.code, logId: result.log.id, minutes: result.log.minutes,
      outcome: result.log.outcome, cleanupMinutesPerPart: result.log.cleanupMinutesPerPart, rpm: result.log.rpm, feedMmPerMin: result.log.feedMmPerMin,
      lifeUsed: result.lifeUsed, minutesTotal: result.minutesTotal,
    })
  }
  return { replay, run: { id: run.id, programId, repeats: run.repeats, jobRef: run.job_ref }, logs }
}
