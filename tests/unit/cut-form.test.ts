// The phone's cut form and the server's schema must agree: a log the form lets through is one the
// server takes, and a log the form refuses is one the server would refuse, so an operator never
// learns of a bad figure only after the phone queued it. Property-based (fast-check), with the
// seed of tests/support/seed.ts.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { cutFormBody, cutFormProblems, parseFormNumber, type CutFormFields } from '../../shared/kerf/cut-form'
import { CUT_LIMITS, CUT_OUTCOMES } from '../../shared/kerf/spindle'
import { CutLogBody } from '../../shared/schemas/spindle'
import { testSeed } from '../support/seed'

const SEED = testSeed('cut form')
const EXTRA = { idempotencyKey: 'property-key-0001', cutAt: '2026-12-01T10:00:00Z' }

/** Numbers around each limit, ordinary ones, and the odd things a person can type. */
function numberText(limits: { min?: number, max: number }) {
  const { min = 0, max } = limits
  const near = [min, max, min - 0.001, max + 0.001, max + 1, 0, -1, 0.005, 1, 0.5, 12.5, 1e-7, max * 10]
  return fc.oneof(
    fc.constantFrom(...near).map(String),
    fc.double({ min: -10, max: max * 2, noNaN: true }).map(String),
    fc.integer({ min: -10, max: max * 2 }).map(String),
    fc.constantFrom('', ' ', 'abc', 'NaN', 'Infinity', '-Infinity', '1,5', ' 30 ', '1e3', '0x10', '12.', '.5'),
  )
}

const fields: fc.Arbitrary<CutFormFields> = fc.record({
  minutes: numberText(CUT_LIMITS.minutes),
  materialId: fc.oneof(fc.constant(null), fc.integer({ min: 1, max: 1000 })),
  outcome: fc.oneof(fc.constant(null), fc.constantFrom(...CUT_OUTCOMES)),
  rpm: fc.oneof(fc.constant(''), numberText({ min: 1, max: CUT_LIMITS.rpm.max })),
  feed: fc.oneof(fc.constant(''), numberText(CUT_LIMITS.feedMmPerMin)),
  note: fc.oneof(
    fc.string({ maxLength: 20 }),
    fc.constantFrom(CUT_LIMITS.noteChars, CUT_LIMITS.noteChars + 1, CUT_LIMITS.noteChars - 1).map((n) => 'x'.repeat(n)),
    fc.constantFrom('  ', `${'y'.repeat(CUT_LIMITS.noteChars)}   `, `  ${'z'.repeat(CUT_LIMITS.noteChars + 1)}`),
  ),
})

/** The fields as typed, each filled one in the body: what the server would judge if the form let it through. */
function typedBody(f: CutFormFields) {
  const number = (text: string) => parseFormNumber(text) ?? undefined
  return {
    ...EXTRA, materialId: f.materialId ?? undefined, minutes: number(f.minutes), outcome: f.outcome ?? undefined,
    rpm: number(f.rpm), feedMmPerMin: number(f.feed), note: f.note === '' ? undefined : f.note,
  }
}

describe('the cut form and the server\'s schema', () => {
  it('accept and refuse the same logs', () => {
    fc.assert(fc.property(fields, (f) => {
      const formAccepts = Object.keys(cutFormProblems(f)).length === 0
      expect(formAccepts).toBe(CutLogBody.safeParse(typedBody(f)).success)
      // And what the form sends once it accepts is what the server takes.
      if (formAccepts) expect(CutLogBody.safeParse(cutFormBody(f, EXTRA)).success).toBe(true)
    }), { seed: SEED, numRuns: 2000 })
  })

  it('take a log at each limit and refuse one just past it', () => {
    const ok: CutFormFields = { minutes: '30', materialId: 1, outcome: 'clean', rpm: '', feed: '', note: '' }
    for (const f of [
      { ...ok, minutes: String(CUT_LIMITS.minutes.min) }, { ...ok, minutes: String(CUT_LIMITS.minutes.max) },
      { ...ok, rpm: String(CUT_LIMITS.rpm.max) }, { ...ok, feed: String(CUT_LIMITS.feedMmPerMin.max) },
      { ...ok, note: 'n'.repeat(CUT_LIMITS.noteChars) },
    ]) {
      expect(cutFormProblems(f)).toEqual({})
      expect(CutLogBody.safeParse(cutFormBody(f, EXTRA)).success).toBe(true)
    }
    for (const [f, field] of [
      [{ ...ok, minutes: '0.009' }, 'minutes'], [{ ...ok, minutes: '1440.01' }, 'minutes'],
      [{ ...ok, rpm: String(CUT_LIMITS.rpm.max + 1) }, 'rpm'], [{ ...ok, feed: '0.001' }, 'feedMmPerMin'],
      [{ ...ok, note: 'n'.repeat(CUT_LIMITS.noteChars + 1) }, 'note'],
    ] as const) {
      expect(Object.keys(cutFormProblems(f))).toEqual([field])
      const parsed = CutLogBody.safeParse(cutFormBody(f, EXTRA))
      expect(parsed.success).toBe(false)
      expect(parsed.error?.issues.map((i) => i.path.join('.'))).toEqual([field])
    }
  })
})
