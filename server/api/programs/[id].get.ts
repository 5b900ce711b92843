// One NC program with its reading per tool and the lines it could not read.
import { ProgramIdParams } from '#shared/schemas/programs'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(ProgramIdParams))
  const p = await requireProgram(useDb(), user.shopId, id)
  return {
    id: p.id, name: p.name, sizeBytes: p.size_bytes, units: p.units, spindleTool: p.spindle_tool, tools: p.tools, problems: p.problems,
    totalMinutes: p.total_minutes, lines: p.line_count, uploadedBy: p.uploaded_by_name, uploadedAt: p.created_at,
  }
})
