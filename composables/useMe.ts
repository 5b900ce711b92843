// The signed-in user and shop, fetched once and shared by every component under one key.

export function useMe() {
  return useFetch('/api/me', { key: 'me', dedupe: 'defer' })
}
