// NC programs: reading an upload (streamed through busboy, cut off at the size limit), storing the
// file and its reading once, and answering programs the way the pages show them.
import { randomBytes } from 'node:crypto'
import Busboy from 'busboy'
import { sql } from 'kysely'
import type { H3Event } from 'h3'
import { NcRefusal, readNcProgram, DEFAULT_ACCELERATION_MM_S2, DEFAULT_RAPID_MM_PER_MIN, type NcReading, type NcTool } from '#shared/kerf/nc/read'
import { programText } from '#shared/kerf/nc/text'
import { PROGRAM_MAX_BYTES, ProgramFields } from '#shared/schemas/programs'
import type { Queryable } from '../../db/connect'
import type { ToolEstimate } from '../../db/tables/programs'

const MB = PROGRAM_MAX_BYTES / 1024 / 1024
const TOO_LARGE = `The program is too large: Kerfbook reads programs of up to ${MB} MB. Split the job into smaller programs in the CAM software.`

/** Reads a multipart upload as it arrives: the `file` part up to the limit (not a byte more is
 *  kept) and the small text fields. Answers 413 when the file is larger. */
export async function readProgramUpload(event: H3Event): Promise<{ data: Buffer, filename: string, fields: Record<string, string> }> {
  // Refused before reading when the request says it is larger; cut off while reading otherwise.
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > PROGRAM_MAX_BYTES + 64 * 1024) {
    throw createError({ statusCode: 413, statusMessage: TOO_LARGE })
  }
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, statusMessage: 'file: send the program as a file upload (multipart/form-data, field "file")', data: { fields: { file: 'send the program as a file upload' } } })
  }
  const req = event.node.req
  return await new Promise((resolve, reject) => {
    let bb: Busboy.Busboy
    try {
      bb = Busboy({ headers: req.headers, limits: { fileSize: PROGRAM_MAX_BYTES, files: 1, fields: 10, fieldSize: 1000 } })
    } catch (err) {
      reject(createError({ statusCode: 400, statusMessage: `The upload could not be read: ${(err as Error).message}.` }))
      return
    }
    const chunks: Buffer[] = []
    const fields: Record<string, string> = {}
    let filename = ''
    let sawFile = false
    let tooLarge = false
    bb.on('file', (name, stream, info) => {
      if (name !== 'file') { stream.resume(); return }
      sawFile = true
      filename = info.filename ?? ''
      stream.on('data', (chunk: Buffer) => { if (!tooLarge) chunks.push(chunk) })
      stream.on('limit', () => { tooLarge = true; chunks.length = 0 })
    })
    bb.on('field', (name, value) => { fields[name] = value })
    bb.on('error', (err) => reject(createError({ statusCode: 400, statusMessage: `The upload could not be read: ${(err as Error).message}.` })))
    bb.on('close', () => {
      if (tooLarge) reject(createError({ statusCode: 413, statusMessage: TOO_LARGE }))
      else if (!sawFile) reject(createError({ statusCode: 400, statusMessage: 'file: choose the NC program to upload', data: { fields: { file: 'choose the NC program to upload' } } }))
      else resolve({ data: Buffer.concat(chunks), filename, fields })
    })
    req.pipe(bb)
  })
}

/** A refusal of the reader as an HTTP error: 400 empty, 415 binary, 422 a program that cannot be read. */
export function refusalError(err: NcRefusal) {
  const statusCode = err.kind === 'empty' ? 400 : err.kind === 'binary' ? 415 : 422
  return createError({ statusCode, statusMessage: err.message, data: { line: err.line, ask: err.ask, fields: { [err.ask ?? 'file']: err.message } } })
}

export function readOrRefuse(text: string, opts: Parameters<typeof readNcProgram>[1]): NcReading {
  try {
    return readNcProgram(text, opts)
  } catch (err) {
    if (err instanceof NcRefusal) throw refusalError(err)
    throw err
  }
}

const mm = (v: number) => Math.round(v * 1000) / 1000
const min = (v: number) => Math.round(v * 10000) / 10000

/** A tool's reading as the API answers it. */
export function toolView(t: NcTool) {
  return {
    tool: t.tool, feedDistanceMm: mm(t.feedDistanceMm), plungeDistanceMm: mm(t.plungeDistanceMm), feedMinutes: min(t.feedMinutes),
    estimatedMinutes: min(t.estimatedMinutes), rapidMinutes: min(t.rapidMinutes), maxDepthMm: mm(t.maxDepthMm),
    spindleRpm: t.spindleRpm, feedsMmPerMin: t.feedsMmPerMin.map((f) => Math.round(f * 100) / 100),
  }
}

/** Reads and stores an uploaded program; nothing is kept when it cannot be read. */
export async function storeProgram(db: Queryable, user: { shopId: number, id: number }, upload: { data: Buffer, filename: string, fields: Record<string, string> }) {
  const fields = validateInput(ProgramFields, upload.fields)
  let text: string
  try {
    text = programText(upload.data)
  } catch (err) {
    if (err instanceof NcRefusal) throw refusalError(err)
    throw err
  }
  const reading = readOrRefuse(text, { spindleTool: fields.spindleTool })
  const name = (fields.name ?? upload.filename.split(/[\\/]/).pop()?.trim() ?? '').slice(0, 200) || 'Program'
  const key = `programs/${user.shopId}/${randomBytes(16).toString('hex')}.nc`
  await useStorage('uploads').setItemRaw(key, upload.data)
  const tools = reading.tools.map(toolView)
  try {
    const row = await db.insertInto('nc_programs').values({
      shop_id: user.shopId, name, size_bytes: upload.data.length, storage_key: key, units: reading.units,
      spindle_tool: fields.spindleTool ?? null, tools: JSON.stringify(tools), problems: JSON.stringify(reading.problems),
      estimates: JSON.stringify({ [settingKey(DEFAULT_ACCELERATION_MM_S2, DEFAULT_RAPID_MM_PER_MIN)]: estimatesOf(reading.tools) }),
      tool_count: tools.length, total_minutes: Math.round(tools.reduce((s, t) => s + t.estimatedMinutes, 0) * 1000) / 1000,
      line_count: reading.lines, uploaded_by: user.id,
    }).returning('id').executeTakeFirstOrThrow()
    return { id: row.id, name, units: reading.units, tools, problems: reading.problems }
  } catch (err) {
    await useStorage('uploads').removeItem(key)
    throw err
  }
}

const settingKey = (accel: number, rapid: number) => `${accel}/${rapid}`
const estimatesOf = (tools: NcTool[]): ToolEstimate[] => tools.map((t) => ({ tool: t.tool, estimatedMinutes: min(t.estimatedMinutes), rapidMinutes: min(t.rapidMinutes) }))

/** The program of the shop, or 404. */
export async function requireProgram(db: Queryable, shopId: number, id: number) {
  const row = await db.selectFrom('nc_programs as p')
    .leftJoin('users as u', (j) => j.onRef('u.id', '=', 'p.uploaded_by').onRef('u.shop_id', '=', 'p.shop_id'))
    .select(['p.id', 'p.name', 'p.size_bytes', 'p.storage_key', 'p.units', 'p.spindle_tool', 'p.tools', 'p.estimates', 'p.problems',
      'p.tool_count', 'p.total_minutes', 'p.line_count', 'p.created_at', 'u.name as uploaded_by_name'])
    .where('p.shop_id', '=', shopId).where('p.id', '=', id).executeTakeFirst()
  if (!row) notFound('program')
  return row
}

/** Each tool's estimated and rapid minutes on a machine with this acceleration and rapid rate:
 *  the stored figures when this setting was read before, else the file is read again for it once
 *  and the figures kept beside the others. */
export async function estimatesFor(db: Queryable, program: Awaited<ReturnType<typeof requireProgram>>, shopId: number, machine: { acceleration_mm_s2: number, rapid_mm_per_min: number }): Promise<ToolEstimate[]> {
  const key = settingKey(machine.acceleration_mm_s2, machine.rapid_mm_per_min)
  const known = program.estimates[key]
  if (known) return known
  const data = await useStorage('uploads').getItemRaw<Buffer>(program.storage_key)
  if (!data) throw createError({ statusCode: 500, statusMessage: `The file of program ${program.name} is missing from storage; upload it again.` })
  const reading = readOrRefuse(programText(Buffer.from(data)), {
    spindleTool: program.spindle_tool ?? undefined, accelerationMmPerS2: machine.acceleration_mm_s2, rapidMmPerMin: machine.rapid_mm_per_min,
  })
  const estimates = estimatesOf(reading.tools)
  await db.updateTable('nc_programs')
    .set({ estimates: sql<string>`estimates || ${JSON.stringify({ [key]: estimates })}::jsonb` })
    .where('shop_id', '=', shopId).where('id', '=', program.id).execute()
  return estimates
}

/** The shop's programs, newest first, as the list shows them. */
export async function listPrograms(db: Queryable, shopId: number) {
  const rows = await db.selectFrom('nc_programs as p')
    .leftJoin('users as u', (j) => j.onRef('u.id', '=', 'p.uploaded_by').onRef('u.shop_id', '=', 'p.shop_id'))
    .select(['p.id', 'p.name', 'p.size_bytes', 'p.units', 'p.tools', 'p.tool_count', 'p.total_minutes', 'p.problems', 'p.created_at', 'u.name as uploaded_by_name'])
    .where('p.shop_id', '=', shopId).orderBy('p.created_at', 'desc').orderBy('p.id', 'desc').limit(500).execute()
  return rows.map((r) => ({
    id: r.id, name: r.name, sizeBytes: r.size_bytes, units: r.units, tools: r.tools.map((t) => t.tool), totalMinutes: r.total_minutes,
    problems: r.problems.length, uploadedBy: r.uploaded_by_name, uploadedAt: r.created_at,
  }))
}
