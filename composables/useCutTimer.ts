// A start/stop timer for the cut under way on one cutter. Its start time lives in localStorage,
// so a reload, a locked phone or a closed tab does not lose the run.
export function useCutTimer(cutterId: MaybeRefOrGetter<number>) {
  const storageKey = computed(() => `kerfbook.cut-timer.v1.${toValue(cutterId)}`)
  const startedAt = ref<number | null>(null)
  const now = ref(Date.now())
  let tick: ReturnType<typeof setInterval> | null = null

  const running = computed(() => startedAt.value !== null)
  const elapsedMs = computed(() => (startedAt.value === null ? 0 : Math.max(0, now.value - startedAt.value)))
  const clock = computed(() => formatElapsed(elapsedMs.value))

  function ticking(on: boolean) {
    if (on && !tick) {
      now.value = Date.now()
      tick = setInterval(() => { now.value = Date.now() }, 1000)
    } else if (!on && tick) {
      clearInterval(tick)
      tick = null
    }
  }

  function read() {
    const saved = Number(localStorage.getItem(storageKey.value))
    startedAt.value = Number.isFinite(saved) && saved > 0 ? saved : null
    ticking(running.value)
  }

  function start() {
    startedAt.value = Date.now()
    localStorage.setItem(storageKey.value, String(startedAt.value))
    ticking(true)
  }

  /** Stops the run: how long it was and when it ended (the cut's finishing time). */
  function stop(): { minutes: number, stoppedAt: Date } | null {
    if (startedAt.value === null) return null
    const stoppedAt = new Date()
    const minutes = timerMinutes(stoppedAt.getTime() - startedAt.value)
    clear()
    return { minutes, stoppedAt }
  }

  function clear() {
    startedAt.value = null
    localStorage.removeItem(storageKey.value)
    ticking(false)
  }

  onMounted(read)
  watch(storageKey, () => { if (import.meta.client) read() })
  onBeforeUnmount(() => ticking(false))

  return { running, elapsedMs, clock, start, stop, clear }
}

/** Whether a timer is running for this cutter, for a page deciding to open the cut form. */
export function cutTimerRunning(cutterId: number): boolean {
  return import.meta.client && Boolean(localStorage.getItem(`kerfbook.cut-timer.v1.${cutterId}`))
}
