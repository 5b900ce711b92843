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

/** The active types to order or receive, by name: what the order pages offer. */
export function useOrderableTypes() {
  const { data } = useCutterTypes(ref(false))
  return computed(() => data.value.map((t) => ({ typeId: t.id, typeName: t.name, supplierId: t.supplierId, unitCostCents: t.unitCostCents })))
}
