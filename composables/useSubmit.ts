// One form submission at a time, with the server's own message kept for the page to show.
import { apiProblem, type ApiProblem } from './useApiError'

export function useSubmit<A extends unknown[], T>(action: (...args: A) => Promise<T>) {
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)

  async function submit(...args: A): Promise<T | undefined> {
    if (pending.value) return undefined
    pending.value = true
    problem.value = null
    try {
      return await action(...args)
    } catch (err) {
      problem.value = apiProblem(err)
      return undefined
    } finally {
      pending.value = false
    }
  }

  const fieldError = (name: string) => problem.value?.fields[name]
  return { pending, problem, submit, fieldError }
}

/** Only paths inside the app may be returned to after signing in. */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : '/'
}
