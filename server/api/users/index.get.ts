// The shop's people, for the owner.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const rows = await useDb().selectFrom('users')
    .select(['id', 'name', 'email', 'role', 'active', 'password_hash', 'pin_hash', 'created_at', 'last_login_at'])
    .where('shop_id', '=', owner.shopId)
    .orderBy('active', 'desc').orderBy('role', 'desc').orderBy('name')
    .execute()
  return rows.map(({ password_hash, pin_hash, ...u }) => ({
    ...u,
    hasPin: pin_hash !== null,
    // An operator added by name only signs in with their PIN: active from the start.
    status: !u.active ? 'off' as const : password_hash || pin_hash ? 'active' as const : 'invited' as const,
  }))
})
