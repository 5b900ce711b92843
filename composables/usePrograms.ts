// The shop's NC programs and one program's reading, through the fetch layer.
export interface ProgramRow {
  id: number, name: string, sizeBytes: number, units: 'mm' | 'inch', tools: number[], totalMinutes: number, problems: number,
  uploadedBy: string | null, uploadedAt: string
}
export interface ProgramTool {
  tool: number, feedDistanceMm: number, plungeDistanceMm: number, feedMinutes: number, estimatedMinutes: number, rapidMinutes: number,
  maxDepthMm: number, spindleRpm: number[], feedsMmPerMin: number[]
}
export interface ProgramDetail {
  id: number, name: string, sizeBytes: number, units: 'mm' | 'inch', spindleTool: number | null, tools: ProgramTool[],
  problems: Array<{ line: number, message: string }>, totalMinutes: number, lines: number, uploadedBy: string | null, uploadedAt: string
}

export function usePrograms() {
  return useFetch<{ programs: ProgramRow[] }>('/api/programs', { key: 'programs', default: () => ({ programs: [] }), transform: (r) => r })
}

export function useProgram(id: MaybeRefOrGetter<number>) {
  return useFetch<ProgramDetail>(() => `/api/programs/${toValue(id)}`, { key: `program-${toValue(id)}` })
}

/** "1.2 MB", "840 KB" */
export function fileSize(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`
}
