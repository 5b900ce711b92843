// Any /api path no route answers: a plain JSON 404 at once. Without it the request falls through
// to the page renderer, which answers a sign-in redirect page and costs twenty times an
// ordinary request's work: a cheap way to load the server.
export default defineEventHandler((event) => {
  throw createError({ statusCode: 404, statusMessage: `No such API route: ${event.method} ${event.path.split('?')[0]}. Check the address.` })
})
