// The navigation of the shell, filtered by the signed-in role. Items marked `phone` also sit in
// the bottom tab bar; the rest are reached from the Account page on a phone. The bit chooser is
// reached from its panel on Home and Scan and from the feeds page, so the desktop bar still fits.
import { roleAtLeast, type Role } from '#shared/kerf/roles'

export type NavIconName = 'home' | 'scan' | 'feeds' | 'crib' | 'report' | 'people' | 'settings' | 'account' | 'insights' | 'programs'
export interface NavItem { to: string, label: string, icon: NavIconName, role: Role, phone: boolean }

const ITEMS: NavItem[] = [
  { to: '/', label: 'Home', icon: 'home', role: 'operator', phone: true },
  { to: '/scan', label: 'Scan', icon: 'scan', role: 'operator', phone: true },
  { to: '/feeds', label: 'Feeds', icon: 'feeds', role: 'operator', phone: false },
  { to: '/programs', label: 'Programs', icon: 'programs', role: 'operator', phone: false },
  { to: '/crib', label: 'Crib', icon: 'crib', role: 'crib_manager', phone: true },
  { to: '/reports', label: 'Reports', icon: 'report', role: 'crib_manager', phone: false },
  { to: '/insights', label: 'Insights', icon: 'insights', role: 'owner', phone: false },
  { to: '/team', label: 'Team', icon: 'people', role: 'owner', phone: false },
  { to: '/settings', label: 'Settings', icon: 'settings', role: 'owner', phone: false },
  { to: '/account', label: 'Account', icon: 'account', role: 'operator', phone: true },
]

export function navigationFor(role: Role | undefined): NavItem[] {
  return role ? ITEMS.filter((item) => roleAtLeast(role, item.role)) : []
}

export function useNavigation() {
  const { user } = useUserSession()
  return computed(() => navigationFor(user.value?.role))
}
