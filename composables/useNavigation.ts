// The navigation of the shell, filtered by the signed-in role.
import { roleAtLeast, type Role } from '#shared/kerf/roles'

export interface NavItem { to: string, label: string, icon: 'home' | 'scan' | 'people' | 'account', role: Role }

const ITEMS: NavItem[] = [
  { to: '/', label: 'Home', icon: 'home', role: 'operator' },
  { to: '/scan', label: 'Scan', icon: 'scan', role: 'operator' },
  { to: '/team', label: 'Team', icon: 'people', role: 'owner' },
  { to: '/account', label: 'Account', icon: 'account', role: 'operator' },
]

export function navigationFor(role: Role | undefined): NavItem[] {
  return role ? ITEMS.filter((item) => roleAtLeast(role, item.role)) : []
}

export function useNavigation() {
  const { user } = useUserSession()
  return computed(() => navigationFor(user.value?.role))
}
