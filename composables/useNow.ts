// The time now, moving on each minute in the browser: for ages shown as "5 minutes old".
export function useNow(everyMs = 60_000) {
  const now = ref(new Date())
  if (import.meta.client) {
    const timer = setInterval(() => { now.value = new Date() }, everyMs)
    if (getCurrentInstance()) onBeforeUnmount(() => clearInterval(timer))
  }
  return now
}
