// Closes the database pool when the server shuts down, so restarts leave no idle connections.
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('close', async () => {
    await closeDb()
  })
})
