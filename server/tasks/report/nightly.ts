// The nightly tooling report: every few minutes, send the report of each shop whose local
// report time has come and that has not had today's report yet.
export default defineTask({
  meta: {
    name: 'report:nightly',
    description: 'E-mail each shop its morning tooling report once its local report time has come',
  },
  async run() {
    const outcomes = await runDueReports(new Date())
    return { result: outcomes }
  },
})
