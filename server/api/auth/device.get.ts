// Public: whether this browser is one of a shop's devices and, if so, the shop's operators who
// can sign in on it with a PIN (names only). The device cookie is the credential.
export default defineEventHandler(async (event) => deviceSignInList(event))
