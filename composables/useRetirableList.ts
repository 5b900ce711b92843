// A crib page listing what the shop can retire and bring back (machines, materials): which rows
// show, the one being edited, the sentence after each change, and retiring (asked first) or
// bringing back through the `<path>/:id/retire` and `/restore` routes. After a change the page's
// own list and the pick lists' shared copy (`pickKey`) are fetched again.
import type { Ref } from 'vue'

interface Words {
  /** The sentence after retiring. */
  retired: (name: string) => string
  /** The question before retiring. */
  confirm: (name: string) => string
}

export function useRetirableList<T extends { id: number, active: boolean }>(
  rows: Ref<T[]>, refresh: () => Promise<unknown>, path: '/api/machines' | '/api/materials', pickKey: string, words: Words,
) {
  const showRetired = ref(false)
  const shown = computed(() => rows.value.filter((r) => showRetired.value || r.active))
  const retiredCount = computed(() => rows.value.filter((r) => !r.active).length)
  const editing = ref<'new' | number | null>(null)
  const notice = ref('')
  const refreshBoth = () => Promise.all([refresh(), refreshNuxtData(pickKey)])

  async function onSaved(message: string) {
    editing.value = null
    notice.value = message
    await refreshBoth()
  }

  const { problem, submit: setActive } = useSubmit(async (id: number, name: string, active: boolean) => {
    await $fetch(`${path}/${id}/${active ? 'restore' : 'retire'}`, { method: 'POST' })
    notice.value = active ? `${name} is back in the pick lists.` : words.retired(name)
    await refreshBoth()
  })

  async function retire(id: number, name: string) {
    if (!confirm(words.confirm(name))) return
    await setActive(id, name, false)
  }

  function open(what: 'new' | number) {
    notice.value = ''
    editing.value = what
  }

  return { showRetired, shown, retiredCount, editing, notice, problem, onSaved, setActive, retire, open }
}
