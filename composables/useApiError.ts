// The one place that turns a failed request into a sentence a person can act on: no connection
// says so and what still works; a server refusal says the server's own sentence, with its fields.
// Never the platform's words (a method, a URL, "Failed to fetch", "<no response>").
import { FetchError } from 'ofetch'

export interface ApiProblem { message: string, fields: Record<string, string>, status?: number, offline?: boolean }

/** What works without a connection, said wherever a request failed for lack of one. */
export const NO_CONNECTION = 'No connection to the server. Cutter pages still open from the copy on this phone, and cut logs, '
  + 'loads and returns wait here and are sent when the connection is back. This part loads again by itself then.'

interface ServerBody { message?: string, statusMessage?: string, data?: { fields?: Record<string, string> } }
type Failure = { statusCode?: number, status?: number, statusMessage?: string, data?: unknown, response?: unknown, cause?: unknown, message?: string }

/** The fetch failure inside an error (useFetch wraps it in a NuxtError whose cause it is). */
function fetchFailure(err: unknown): FetchError | undefined {
  for (let e: unknown = err, depth = 0; e && depth < 4; e = (e as Failure).cause, depth++) {
    if (e instanceof FetchError || (e as Error).name === 'FetchError') return e as FetchError
  }
  return undefined
}

/** Whether the request got no answer at all: no signal, the server unreachable, a timeout. */
export function isNoConnection(err: unknown): boolean {
  if (!err) return false
  const fetchErr = fetchFailure(err)
  if (fetchErr) return !fetchErr.response
  // useFetch's error keeps only the fetch error's own cause: what fetch throws when nothing
  // answers (a TypeError), or the abort of a timeout.
  for (let e: unknown = err, depth = 0; e && depth < 4; e = (e as Failure).cause, depth++) {
    if (e instanceof TypeError || (e as Error).name === 'TimeoutError' || (e as Error).name === 'AbortError') return true
  }
  return false
}

export function apiProblem(err: unknown): ApiProblem {
  if (isNoConnection(err)) return { message: NO_CONNECTION, fields: {}, offline: true }
  const fetchErr = fetchFailure(err)
  const e = (fetchErr ?? err) as Failure
  if (e && typeof e === 'object' && (e.statusCode || e.status || e.data)) {
    const data = (fetchErr?.data ?? e.data) as ServerBody | undefined
    const status = e.statusCode ?? e.status
    return {
      message: data?.message || data?.statusMessage || e.statusMessage || (status ? `The server refused this (${status}). Try again, or tell the crib manager if it keeps happening.` : 'The server refused this.'),
      fields: data?.data?.fields ?? {},
      status,
    }
  }
  return { message: err instanceof Error ? err.message : String(err), fields: {} }
}
