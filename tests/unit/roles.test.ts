// The role order the server enforces: operator < crib manager < owner.
import { describe, expect, it } from 'vitest'
import { roleAtLeast } from '../../shared/kerf/roles'

describe('roles', () => {
  it('each role can do what the roles below it can, and no more', () => {
    expect(roleAtLeast('owner', 'crib_manager')).toBe(true)
    expect(roleAtLeast('owner', 'operator')).toBe(true)
    expect(roleAtLeast('crib_manager', 'operator')).toBe(true)
    expect(roleAtLeast('crib_manager', 'owner')).toBe(false)
    expect(roleAtLeast('operator', 'crib_manager')).toBe(false)
    expect(roleAtLeast('operator', 'operator')).toBe(true)
  })
})
