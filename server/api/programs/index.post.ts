// Upload an NC program (multipart, field `file`, up to 20 MB; optional `name`, and `spindleTool`
// for a program that cuts before its first tool change). It is read once: the reading is stored
// with the file and answered; a file that cannot be read answers a sentence and nothing is kept.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const upload = await readProgramUpload(event)
  const program = await storeProgram(useDb(), user, upload)
  setResponseStatus(event, 201)
  return program
})
