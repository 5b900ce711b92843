// The database's part in the server's life: the pool closes when the server shuts down, so
// restarts leave no idle connections; and a request that fails because PostgreSQL is down,
// restarting or unreachable answers 503 with a sentence to act on (and Retry-After) instead of
// a bare 500. Clients that retry (the phone's cut-log queue) then send the same request again.
import { isDatabaseUnavailable } from '../db/connect'

const DATABASE_UNAVAILABLE = 'The database is not reachable right now. Nothing was lost: try again in a few seconds.'

export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('close', async () => {
    await closeDb()
  })

  // h3 calls its app's onError for every error a handler throws; Nitro's own handler (and
  // Nuxt's page for browsers) then renders the response from the error's status and message.
  const render = nitro.h3App.options.onError
  nitro.h3App.options.onError = (error, event) => {
    if (error.statusCode >= 500 && isDatabaseUnavailable(error.cause ?? error)) {
      error.statusCode = 503
      error.statusMessage = DATABASE_UNAVAILABLE
      error.message = DATABASE_UNAVAILABLE
      // Known and explained: not the "Server Error" that hides an unexpected failure.
      error.unhandled = false
      setResponseStatus(event, 503, DATABASE_UNAVAILABLE)
      setResponseHeader(event, 'retry-after', 5)
    }
    return render?.(error, event)
  }
})
