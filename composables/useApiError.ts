// Reads the message a person can act on out of a failed $fetch/useFetch, plus per-field messages.
import { FetchError } from 'ofetch'

export interface ApiProblem { message: string, fields: Record<string, string>, status?: number }

export function apiProblem(err: unknown): ApiProblem {
  if (err instanceof FetchError) {
    const data = err.data as { message?: string, statusMessage?: string, data?: { fields?: Record<string, string> } } | undefined
    if (!err.response) {
      return { message: 'No connection to the server. Check the Wi-Fi and try again.', fields: {} }
    }
    return {
      message: data?.message || data?.statusMessage || err.statusMessage || `The server answered ${err.statusCode}.`,
      fields: data?.data?.fields ?? {},
      status: err.statusCode,
    }
  }
  return { message: err instanceof Error ? err.message : String(err), fields: {} }
}
