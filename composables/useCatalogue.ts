// The catalogue and the suppliers as the crib pages fetch them, each under one key so a save on
// one page refreshes the others.
export function useCutterTypes(includeArchived: Ref<boolean>) {
  return useFetch('/api/cutter-types', {
    key: 'cutter-types',
    query: computed(() => ({ archived: includeArchived.value ? 'include' : 'exclude' })),
    default: () => [],
  })
}

export function useSuppliers() {
  return useFetch('/api/suppliers', { key: 'suppliers', query: { archived: 'include' }, default: () => [] })
}
