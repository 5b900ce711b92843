// The inventory's query string as the route and the page read it: sort direction, status lists,
// blank form fields, and the limits that keep a page small.
import { describe, expect, it } from 'vitest'
import { InventoryQuery } from '#shared/schemas/inventory'

const parse = (query: Record<string, unknown>) => InventoryQuery.safeParse(query)

describe('the inventory query', () => {
  it('defaults to the first page of 50, by label code', () => {
    expect(parse({}).data).toEqual({ sort: { field: 'code', desc: false }, page: 1, pageSize: 50 })
  })

  it('reads a leading minus as descending', () => {
    expect(parse({ sort: '-lifeUsed' }).data?.sort).toEqual({ field: 'lifeUsed', desc: true })
    expect(parse({ sort: 'updatedAt' }).data?.sort).toEqual({ field: 'updatedAt', desc: false })
  })

  it('takes one status, a comma list, or the same field repeated', () => {
    expect(parse({ status: 'lost' }).data?.status).toEqual(['lost'])
    expect(parse({ status: 'in_crib, in_spindle' }).data?.status).toEqual(['in_crib', 'in_spindle'])
    expect(parse({ status: ['in_crib', 'lost'] }).data?.status).toEqual(['in_crib', 'lost'])
  })

  it('treats blank fields as absent', () => {
    expect(parse({ typeId: '', machineId: '', q: '', due: '', sort: '', page: '' }).data).toEqual({ sort: { field: 'code', desc: false }, page: 1, pageSize: 50 })
  })

  it('turns the strings of a URL into numbers and booleans', () => {
    expect(parse({ typeId: '7', lifeMin: '0.5', lifeMax: '0.9', due: 'true', page: '3', pageSize: '200' }).data)
      .toMatchObject({ typeId: 7, lifeMin: 0.5, lifeMax: 0.9, due: true, page: 3, pageSize: 200 })
  })

  it.each([
    [{ sort: 'price' }, 'sort'],
    [{ sort: '--code' }, 'sort'],
    [{ pageSize: '201' }, 'pageSize'],
    [{ pageSize: '0' }, 'pageSize'],
    [{ page: '1.5' }, 'page'],
    [{ status: 'in_crib,borrowed' }, 'status'],
    [{ lifeMin: '0.9', lifeMax: '0.9' }, 'lifeMax'],
    [{ lifeMin: '-1' }, 'lifeMin'],
  ])('refuses %o, naming %s', (query, field) => {
    const result = parse(query)
    expect(result.success).toBe(false)
    expect(result.error!.issues[0]!.path[0]).toBe(field)
  })
})
