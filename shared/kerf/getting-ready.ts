// "Getting ready": the steps between a new shop and its first logged cut, in the order a shop
// takes them. The server ticks each from the shop's own rows (server/utils/platform/getting-ready.ts);
// Home lists the open ones to the owner and crib manager, each linking to the page that does it.
export const GETTING_READY_STEPS = [
  { key: 'machine', title: 'Add a machine', hint: 'Its name, spindle speed range and tool-changer pockets.', to: '/crib/machines' },
  { key: 'materials', title: 'Check your materials', hint: 'The starting list is there: add what you cut that it lacks, adjust wear factors.', to: '/crib/materials' },
  { key: 'supplier', title: 'Add a supplier', hint: 'Who you buy bits from, and who regrinds them.', to: '/crib/suppliers' },
  { key: 'cutterType', title: 'Add a cutter type', hint: 'A bit you stock: its geometry, rated life and price.', to: '/crib/catalogue' },
  { key: 'stock', title: 'Receive stock and print labels', hint: 'Book in the bits on the shelf and stick a label on each.', to: '/crib/orders' },
  { key: 'operator', title: 'Invite an operator', hint: 'The people at the machines, who load bits and log cuts.', to: '/team' },
  { key: 'firstCut', title: 'Log the first cut', hint: 'Scan a bit\u2019s label at the machine, load it and log the minutes cut.', to: '/scan' },
] as const

export type GettingReadyKey = typeof GETTING_READY_STEPS[number]['key']

export interface GettingReadyStep {
  key: GettingReadyKey
  title: string
  hint: string
  /** The page that does the step; null where the person cannot do it themselves (only owners invite people). */
  to: string | null
  done: boolean
}
