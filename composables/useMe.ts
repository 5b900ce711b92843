// The signed-in user and shop, fetched once and shared by every component under one key.
import type { Me } from '~~/server/utils/platform/me'

export function useMe() {
  return useFetch<Me>('/api/me', { key: 'me', dedupe: 'defer' })
}
