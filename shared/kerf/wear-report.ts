// The learned-wear model in plain words: each material's and cutter type's figures rounded for
// showing, with the sentences that say what the data cannot tell (shared/kerf/wear-model.ts
// makes the figures). Materials the data cannot tell apart are gathered into groups. Pure.
import { FAIR_LIVES, isWide, type WearModel } from './wear-model'

export interface NamedMaterial { id: number, name: string, active: boolean }
export interface NamedType { id: number, name: string, ratedLifeMinutes: number }

const round2 = (x: number) => Math.round(x * 100) / 100
const round3 = (x: number) => Math.round(x * 1000) / 1000
const interval3 = (iv: [number, number] | null): [number, number] | null => (iv ? [round3(iv[0]), round3(iv[1])] : null)
const listOf = (names: string[]) => (names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`)
const livesWord = (n: number) => `${n} ${n === 1 ? 'life' : 'lives'}`

/** Connected groups of materials from the pairs the model could not tell apart. */
function groups(model: WearModel): Map<number, number[]> {
  const parent = new Map<number, number>()
  const find = (x: number): number => {
    const p = parent.get(x) ?? x
    if (p === x) return x
    const root = find(p)
    parent.set(x, root)
    return root
  }
  for (const m of model.materials) for (const other of m.group) parent.set(find(m.materialId), find(other))
  const byRoot = new Map<number, number[]>()
  for (const m of model.materials) if (m.group.length) byRoot.set(find(m.materialId), [...(byRoot.get(find(m.materialId)) ?? []), m.materialId])
  const out = new Map<number, number[]>()
  for (const members of byRoot.values()) for (const id of members) out.set(id, members.filter((x) => x !== id))
  return out
}

export function describeWear(model: WearModel, materials: readonly NamedMaterial[], types: readonly NamedType[]) {
  const materialName = new Map(materials.map((m) => [m.id, m.name]))
  const typeName = new Map(types.map((t) => [t.id, t.name]))
  const grouped = groups(model)
  const reference = model.referenceMaterialId === null ? null : materialName.get(model.referenceMaterialId) ?? null

  const rows = model.materials.map((m) => {
    const flags: string[] = []
    const group = (grouped.get(m.materialId) ?? []).map((id) => ({ materialId: id, name: materialName.get(id) ?? '' }))
    if (m.reference) flags.push(`The reference material: its factor stays ${m.startingFactor} by definition, and the cutter types' rated lives are read against it.`)
    else if (m.lives === 0) flags.push('No lives cut it in these dates: the starting figure stands.')
    else if (m.tooFewLives) flags.push(`Too few lives: ${livesWord(m.finishedLives)} ended by wear (${FAIR_LIVES} make a fair figure).`)
    if (group.length) {
      const always = group.filter((g) => m.together.includes(g.materialId)).map((g) => g.name)
      const often = group.filter((g) => !m.together.includes(g.materialId)).map((g) => g.name)
      if (always.length) flags.push(`Cannot be told apart from ${listOf(always)}: always cut together.`)
      if (often.length) flags.push(`Cannot be told apart from ${listOf(often)}: cut together too often.`)
    }
    const withTypes = m.typeGroup.map((id) => typeName.get(id) ?? '')
    if (withTypes.length) flags.push(`Cannot be told apart from the rated life of ${listOf(withTypes)}: cut with that type only.`)
    if (m.disagrees) flags.push(`The starting figure (${m.startingFactor}) disagrees strongly with the data.`)
    if (!m.reference && m.lives > 0 && isWide(m.interval)) flags.push('The interval is wide: adopting this figure asks first.')
    return {
      materialId: m.materialId,
      name: materialName.get(m.materialId) ?? '',
      active: materials.find((x) => x.id === m.materialId)?.active ?? true,
      startingFactor: m.startingFactor,
      learnedFactor: round3(m.learnedFactor),
      interval: interval3(m.interval),
      lives: m.lives,
      finishedLives: m.finishedLives,
      censoredLives: m.censoredLives,
      minutes: Math.round(m.minutes * 100) / 100,
      flags,
      group,
    }
  })

  const typeRows = model.types.map((t) => {
    const type = types.find((x) => x.id === t.typeId)
    const flags: string[] = []
    if (t.finishedLives < FAIR_LIVES) flags.push(`Too few lives: ${livesWord(t.finishedLives)} ended by wear (${FAIR_LIVES} make a fair figure).`)
    const withMaterials = model.materials.filter((m) => m.typeGroup.includes(t.typeId)).map((m) => materialName.get(m.materialId) ?? '')
    if (withMaterials.length) flags.push(`Cannot be told apart from the wear factor of ${listOf(withMaterials)}: that type cut nothing else.`)
    if (t.interval && (t.interval[1] < 1 || t.interval[0] > 1)) {
      flags.push(`Lives last ${round2(t.ratedLifeRatio)} × the rated ${type?.ratedLifeMinutes.toLocaleString('en-US') ?? '?'} min${reference ? ` in ${reference}` : ''}: the rating is ${t.interval[1] < 1 ? 'optimistic' : 'cautious'}.`)
    }
    return {
      typeId: t.typeId,
      name: typeName.get(t.typeId) ?? '',
      ratedLifeMinutes: type?.ratedLifeMinutes ?? 0,
      ratedLifeRatio: round3(t.ratedLifeRatio),
      interval: interval3(t.interval),
      finishedLives: t.finishedLives,
      censoredLives: t.censoredLives,
      flags,
    }
  })
  return { materials: rows, types: typeRows, scatter: model.scatter ? round3(model.scatter.value) : null, referenceMaterialId: model.referenceMaterialId }
}
