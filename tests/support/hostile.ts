// Generators of hostile input for the fuzz test, with fast-check. A route's body is described
// field by field (what each field accepts); from that come bodies that break at least one rule
// (a wrong type, a missing field, a number out of range or not whole, a string too long or empty,
// a value outside a list, text with a NUL character), wrapped in junk keys such as __proto__, and
// whole bodies that are not what the route reads at all (malformed JSON, other content types).
import fc from 'fast-check'

export type Kind =
  | { t: 'id' }
  | { t: 'int', min: number, max: number }
  | { t: 'num', min: number, max: number, gt?: boolean, lt?: boolean }
  | { t: 'str', max: number | null, min?: number, trim?: boolean }
  | { t: 'enum', values: readonly string[] }
  | { t: 'bool' }
  | { t: 'email' }
  | { t: 'date' }
  | { t: 'datetime' }
  | { t: 'array', of: Field, min?: number, max: number }
  | { t: 'object', fields: Fields, sample: Record<string, unknown> }
  | { t: 'custom', bad: fc.Arbitrary<unknown> }

export type Field = Kind & { optional?: boolean, nullable?: boolean }
export type Fields = Record<string, Field>

/** A piece of JSON text put into a body as it is: NaN, Infinity and 1e999 have no JSON value. */
export class Raw {
  constructor(readonly text: string) {}
}

// Field helpers; `o` adds optional / nullable.
type Opt = { optional?: boolean, nullable?: boolean }
export const id = (o: Opt = {}): Field => ({ t: 'id', ...o })
export const int = (min: number, max: number, o: Opt = {}): Field => ({ t: 'int', min, max, ...o })
export const num = (min: number, max: number, o: Opt & { gt?: boolean, lt?: boolean } = {}): Field => ({ t: 'num', min, max, ...o })
export const str = (max: number | null, o: Opt & { min?: number, trim?: boolean } = {}): Field => ({ t: 'str', max, trim: true, ...o })
export const oneOf = (values: readonly string[], o: Opt = {}): Field => ({ t: 'enum', values, ...o })
export const bool = (o: Opt = {}): Field => ({ t: 'bool', ...o })
export const email = (o: Opt = {}): Field => ({ t: 'email', ...o })
export const date = (o: Opt = {}): Field => ({ t: 'date', ...o })
export const datetime = (o: Opt = {}): Field => ({ t: 'datetime', ...o })
export const list = (of: Field, min: number, max: number, o: Opt = {}): Field => ({ t: 'array', of, min, max, ...o })
export const object = (fields: Fields, sample: Record<string, unknown>, o: Opt = {}): Field => ({ t: 'object', fields, sample, ...o })
export const custom = (bad: fc.Arbitrary<unknown>, o: Opt = {}): Field => ({ t: 'custom', bad, ...o })

const MAX_INT32 = 2_147_483_647
const POLLUTION_KEYS = ['__proto__', 'constructor', 'prototype', '__defineGetter__', 'hasOwnProperty', 'toString', 'valueOf'] as const

/** An object that holds `key` as its own property, even for __proto__ (a literal would set the prototype). */
function withOwn(target: Record<string, unknown>, key: string, value: unknown) {
  Object.defineProperty(target, key, { value, enumerable: true, configurable: true, writable: true })
  return target
}

const pollution = fc.constantFrom(...POLLUTION_KEYS).chain((key) => fc.constantFrom<unknown>(
  { role: 'owner', isAdmin: true }, { prototype: { polluted: 1 } }, 'owner', 1, null, [],
).map((value) => withOwn({}, key, value)))

// Unicode of every kind: whole code points, broken surrogates, joiners, right-to-left marks.
const text = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.constantFrom('', ' ', '\u0000', 'null', 'undefined', 'true', '[]', '{}', '<script>alert(1)</script>', '\'; drop table users; --',
    '\u202Eevil', '\uD800', 'e\u0301', '%00', '../../etc/passwd', '{{7*7}}', '${7*7}', '=cmd|\' /C calc\'!A0'),
)
const junkValue: fc.Arbitrary<unknown> = fc.oneof(
  text,
  fc.integer(),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.oneof(text, fc.integer()), { maxLength: 4 }),
  fc.dictionary(text, fc.oneof(text, fc.integer(), fc.constant(null)), { maxKeys: 3 }),
  pollution,
  fc.constantFrom(new Raw('NaN'), new Raw('Infinity'), new Raw('-Infinity'), new Raw('1e999'), new Raw('-1e999'), new Raw('-0')),
)

const notNumbers = fc.oneof(
  text,
  fc.constantFrom('1', '0', '-1', '1e3', '0x10', ' 2 ', 'NaN', 'Infinity', '1,5', '١٢'),
  fc.boolean(),
  fc.array(fc.integer(), { maxLength: 3 }),
  fc.dictionary(text, fc.integer(), { maxKeys: 2 }),
  pollution,
  fc.constantFrom(new Raw('NaN'), new Raw('Infinity'), new Raw('-Infinity'), new Raw('1e999'), new Raw('-1e999')),
)
const notStrings = fc.oneof(
  fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.boolean(),
  fc.array(text, { maxLength: 3 }), fc.dictionary(text, text, { maxKeys: 2 }), pollution, fc.constant(new Raw('1e999')),
)

// Characters no trim removes, of one, two and three UTF-8 bytes and a surrogate pair.
const longChar = fc.constantFrom('x', 'é', '€', '中', '😀', 'ß')
function tooLong(max: number): fc.Arbitrary<string> {
  return fc.tuple(longChar, fc.oneof(fc.integer({ min: 1, max: 50 }), fc.constant(max * 20 + 1000)))
    .map(([c, extra]) => c.repeat(max + extra))
}

const huge = fc.constantFrom(MAX_INT32 + 1, 2 ** 53, 2 ** 53 + 2, 1e21, 1e308, -1e308, -MAX_INT32 - 2, Number.MAX_VALUE)

/** Values `field` does not accept. */
export function invalid(field: Field): fc.Arbitrary<unknown> {
  const arbs: Array<fc.Arbitrary<unknown>> = []
  if (!field.nullable) arbs.push(fc.constant(null))
  switch (field.t) {
    case 'id':
      arbs.push(notNumbers, huge, fc.integer({ max: 0 }), fc.maxSafeInteger().filter((n) => n > MAX_INT32),
        fc.double({ min: 0.001, max: 1e6, noNaN: true }).filter((n) => !Number.isInteger(n)))
      break
    case 'int': {
      arbs.push(notNumbers, huge.filter((n) => n > field.max || n < field.min), fc.maxSafeInteger().filter((n) => n < field.min),
        fc.maxSafeInteger().filter((n) => n > field.max))
      if (field.max > field.min) arbs.push(fc.constant(field.min + 0.5))
      break
    }
    case 'num': {
      const below = field.gt ? fc.double({ max: field.min, noNaN: true, noDefaultInfinity: true }) : fc.double({ max: field.min, maxExcluded: true, noNaN: true, noDefaultInfinity: true })
      const above = field.lt ? fc.double({ min: field.max, noNaN: true, noDefaultInfinity: true }) : fc.double({ min: field.max, minExcluded: true, noNaN: true, noDefaultInfinity: true })
      arbs.push(notNumbers, below, above, fc.constantFrom(new Raw('1e999'), new Raw('NaN')))
      break
    }
    case 'str':
      arbs.push(notStrings, fc.string({ maxLength: 5 }).map((s) => `${s}\u0000${s}`))
      if (field.max !== null) arbs.push(tooLong(field.max))
      if (field.min) arbs.push(field.trim ? fc.constantFrom('', ' ', '\t\n ', '\u00A0') : fc.constant(''))
      break
    case 'enum':
      arbs.push(notStrings, text.filter((s) => !field.values.includes(s)),
        fc.constantFrom(...field.values).map((v) => v.toUpperCase()).filter((v) => !field.values.includes(v)),
        fc.constantFrom(...field.values).map((v) => ` ${v}`), fc.constantFrom(...field.values).map((v) => `${v}\u0000`))
      break
    case 'bool':
      arbs.push(fc.constantFrom('true', 'false', 1, 0, 'yes', '', [], {}), pollution)
      break
    case 'email':
      arbs.push(notStrings, fc.constantFrom('plainaddress', '@example.com', 'a@', 'a b@example.com', 'a@@example.com', '<a@example.com>',
        'a@example.com\u0000', `${'x'.repeat(250)}@example.com`, 'owner@example.com,crib@example.com'),
      tooLong(300).map((s) => `${s}@example.com`))
      break
    case 'date':
      arbs.push(notStrings, fc.constantFrom('2026-13-01', '2026-00-10', '2026-02-30', '2026-1-1', '20260101', 'yesterday', '2026-01-01T00:00:00Z',
        '-2026-01-01', '+275760-09-13', '2026-01-01\u0000', '0000-01-01', '1899-12-31'))
      break
    case 'datetime':
      arbs.push(notStrings, fc.constantFrom('2026-01-01', '2026-02-30T10:00:00Z', '2026-01-01T24:00:00Z', '2026-01-01T00:00:00+99:99',
        'now', '1767225600000', '2026-01-01T00:00:00Z\u0000', '+275760-09-13T00:00:00.000Z', '0000-01-01T00:00:00Z'))
      break
    case 'array': {
      arbs.push(fc.oneof(notStrings.filter((v) => !Array.isArray(v)), text))
      arbs.push(fc.integer({ min: 1, max: 3 }).chain((n) => invalid(field.of).map((bad) => [...Array.from({ length: n - 1 }, () => sample(field.of)), bad])))
      if (field.min) arbs.push(fc.constant([]))
      arbs.push(fc.constant(Array.from({ length: field.max + 1 }, () => sample(field.of))))
      break
    }
    case 'object':
      arbs.push(fc.oneof(text, fc.integer(), fc.array(fc.integer(), { maxLength: 2 })), invalidObject(field.fields, field.sample))
      break
    case 'custom':
      arbs.push(field.bad)
      break
  }
  return fc.oneof(...arbs)
}

/** A value `field` accepts (for the other elements of a list). */
function sample(field: Field): unknown {
  switch (field.t) {
    case 'object': return { ...field.sample }
    case 'id': return 1
    case 'int': return field.min
    case 'num': return field.gt ? Math.min(field.max, field.min + 1) : field.min
    case 'bool': return true
    case 'enum': return field.values[0]
    default: return 'fine'
  }
}

/** A copy of a valid object with one to three rules broken, and sometimes junk keys besides. */
export function invalidObject(fields: Fields, valid: Record<string, unknown>): fc.Arbitrary<Record<string, unknown>> {
  const names = Object.keys(fields)
  const required = names.filter((n) => !fields[n]!.optional)
  const breakOne: fc.Arbitrary<[string, unknown]> = fc.oneof(
    ...names.map((n) => invalid(fields[n]!).map((v): [string, unknown] => [n, v])),
    ...(required.length ? [fc.constantFrom(...required).map((n): [string, unknown] => [n, MISSING])] : []),
  )
  const junkKeys = fc.array(fc.tuple(fc.oneof(fc.constantFrom(...POLLUTION_KEYS), text), junkValue), { maxLength: 3 })
  return fc.tuple(fc.array(breakOne, { minLength: 1, maxLength: 3 }), junkKeys).map(([breaks, junk]) => {
    const body: Record<string, unknown> = {}
    // Junk first, so the fields broken on purpose win over a junk key of the same name.
    for (const [key, value] of junk) if (!(key in fields)) withOwn(body, key, value)
    for (const [key, value] of Object.entries(valid)) withOwn(body, key, value)
    for (const [key, value] of breaks) {
      if (value === MISSING) Reflect.deleteProperty(body, key)
      else withOwn(body, key, value)
    }
    return body
  })
}

const MISSING = Symbol('missing')

/** JSON text for a value, with Raw pieces put in as they are. */
export function encode(value: unknown): string {
  const raws: string[] = []
  const json = JSON.stringify(value, (_key, v) => {
    if (v instanceof Raw) {
      raws.push(v.text)
      return `@@raw${raws.length - 1}@@`
    }
    return v
  })
  return json === undefined ? '' : json.replace(/"@@raw(\d+)@@"/g, (_, i: string) => raws[Number(i)]!)
}

export interface Sent { body: string, contentType?: string, label: string }

/** A whole request body the route cannot read as valid: a broken object, or not an object at all. */
export function hostileBody(fields: Fields, valid: Record<string, unknown>, opts: { emptyIsValid: boolean }): fc.Arbitrary<Sent> {
  const broken = invalidObject(fields, valid)
  const validText = encode(valid)
  const wholes: Array<fc.Arbitrary<Sent>> = [
    broken.map((b) => ({ body: encode(b), contentType: 'application/json', label: 'broken object' })),
    broken.map((b) => ({ body: encode(b), contentType: 'text/plain', label: 'broken object as text/plain' })),
    broken.map((b) => ({ body: encode(b), label: 'broken object, no content type' })),
    // Not an object at all.
    fc.oneof(fc.integer(), text, fc.array(fc.constant(valid), { minLength: 1, maxLength: 2 }), fc.boolean())
      .map((v) => ({ body: encode(v), contentType: 'application/json', label: 'not an object' })),
    // Malformed JSON: cut short, single quotes, trailing commas, comments, bare words.
    fc.integer({ min: 1, max: Math.max(1, validText.length - 1) }).map((n) => ({ body: validText.slice(0, n), contentType: 'application/json', label: 'cut short' })),
    fc.constantFrom('{', '{"a":1,}', '{\'a\':1}', '{"a":1} trailing', '/* c */ {}', '{"a": undefined}', 'NaN', '\u0000', '\uFEFF{', '[1,2',
      `${validText}${validText}`, '{"__proto__": {"role": "owner"}', '\\u0000').map((body) => ({ body, contentType: 'application/json', label: 'malformed JSON' })),
    // Another content type with text that is no object of this route.
    fc.constantFrom<Sent>(
      { body: '<xml><a>1</a></xml>', contentType: 'application/xml', label: 'XML' },
      { body: '--x\r\nContent-Disposition: form-data; name="a"\r\n\r\n1\r\n--x--\r\n', contentType: 'multipart/form-data; boundary=x', label: 'multipart for a JSON route' },
      { body: 'GIF89a\u0001\u0000', contentType: 'image/gif', label: 'an image' },
    ),
  ]
  if (!opts.emptyIsValid) {
    wholes.push(fc.constantFrom<Sent>(
      { body: '', contentType: 'application/json', label: 'empty' },
      { body: 'null', contentType: 'application/json', label: 'null' },
      { body: '{}', contentType: 'application/json', label: 'empty object' },
    ).filter((s) => s.body !== '{}' || Object.values(fields).some((f) => !f.optional)))
  }
  return fc.oneof({ weight: 6, arbitrary: wholes[0]! }, ...wholes.slice(1).map((arbitrary) => ({ weight: 1, arbitrary })))
}

/** Percent-encodes text byte by byte (a lone surrogate goes as the replacement character, as a browser sends it). */
export function percent(s: string): string {
  return [...Buffer.from(s, 'utf8')].map((b) => (/[A-Za-z0-9_.~-]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).toUpperCase().padStart(2, '0')}`)).join('')
}

/** A query string of junk: repeated keys, bracket keys, pollution, odd encodings. */
export function hostileQuery(keys: readonly string[]): fc.Arbitrary<string> {
  const key = fc.oneof(fc.constantFrom(...keys, ...POLLUTION_KEYS, '__proto__[role]', 'constructor[prototype][x]', `${keys[0] ?? 'a'}[]`), text)
  const value = fc.oneof(text, fc.integer().map(String), fc.constantFrom('', '-1', '0', '1.5', '1e999', 'NaN', '2147483648', '99999999999999999999',
    '0000-01-01', '9999-12-31', '2026-02-30', 'true', 'include', '%', '%zz', '%00', '%E0%A4%A', 'a'.repeat(5000)))
  return fc.array(fc.tuple(key, value), { minLength: 1, maxLength: 5 })
    .map((pairs) => pairs.map(([k, v]) => `${percent(k)}=${v.startsWith('%') ? v : percent(v)}`).join('&'))
}

/** Path parameters that are no record's id: not numbers, out of range, traversal, control characters. */
export const hostileId = fc.oneof(
  fc.constantFrom('abc', '-1', '0', '1.5', '2147483648', '99999999999999999999', '1e999', 'NaN', 'Infinity', '%00', '%2e%2e%2f', '..',
    '%E2%80%AE1', '1%00', '%zz', '0x7fffffff', '00000000-0000-0000-0000-000000000000', '\'1\'', '1;drop', 'a'.repeat(3000)),
  fc.maxSafeInteger().filter((n) => n > MAX_INT32).map(String),
  text.filter((s) => s.length > 0).map(percent),
)

const TINY = [Number.MIN_VALUE, 1e-300, 1e-9, 0.0001, 0.00049, 0.0005, 0.001, 0.004, 0.005, 0.0099]

/** Values `field` accepts, at its edges: the smallest step above a bound, the bounds, the longest text in wide characters. */
export function extreme(field: Field): fc.Arbitrary<unknown> {
  const arbs: Array<fc.Arbitrary<unknown>> = []
  if (field.nullable) arbs.push(fc.constant(null))
  switch (field.t) {
    case 'id':
      arbs.push(fc.constantFrom(1, MAX_INT32))
      break
    case 'int':
      arbs.push(fc.constantFrom(field.min, field.max), fc.integer({ min: field.min, max: field.max }))
      break
    case 'num': {
      const low = TINY.map((t) => field.min + t).filter((n) => n > field.min || (!field.gt && n >= field.min))
      const high = TINY.map((t) => field.max - t).filter((n) => n < field.max || (!field.lt && n <= field.max))
      arbs.push(fc.constantFrom(...low, ...high, ...(field.gt ? [] : [field.min]), ...(field.lt ? [] : [field.max])),
        fc.double({ min: field.min, max: field.max, minExcluded: !!field.gt, maxExcluded: !!field.lt, noNaN: true }))
      break
    }
    case 'str': {
      const max = field.max ?? 5000
      const min = field.min ?? 0
      arbs.push(
        fc.tuple(fc.constantFrom('x', 'é', '中', '\u0301', 'ﷺ'), fc.constantFrom(max, min || 1)).map(([c, n]) => c.repeat(n)),
        fc.constantFrom(max, min || 1).map((n) => `${'😀'.repeat(Math.floor(n / 2))}${n % 2 ? 'x' : ''}`),
        fc.string({ unit: 'grapheme', minLength: min, maxLength: Math.min(max, 60) }).filter((s) => (field.trim ? s.trim() : s).length >= min && !s.includes('\u0000')),
        fc.constantFrom('\u202Eright-to-left', 'a\u200Bb', '\'; drop table users; --', '<img src=x onerror=alert(1)>', '=1+1', '%s%n', '\uD800x')
          .filter((s) => s.length <= max),
      )
      if (field.trim) arbs.push(fc.constant(`\t ${'y'.repeat(Math.max(min, 1))}\u00A0\n`))
      break
    }
    case 'enum':
      arbs.push(fc.constantFrom(...field.values))
      break
    case 'bool':
      arbs.push(fc.boolean())
      break
    case 'email':
      arbs.push(fc.constantFrom('EDGE.Person@Example.COM', ' edge@example.com ', `${'e'.repeat(60)}@${'d'.repeat(60)}.example.com`, 'o\'neil+tag@example.com'))
      break
    case 'date':
      arbs.push(fc.constantFrom('1900-01-01', '2000-02-29', '9999-12-31', '2026-12-31'))
      break
    case 'datetime':
      arbs.push(fc.constantFrom('1900-01-01T00:00:00Z', '2000-02-29T23:59:59.999+14:00', '2026-01-01T00:00:00-12:00'))
      break
    case 'array':
      arbs.push(fc.array(extreme(field.of), { minLength: field.min ?? 0, maxLength: Math.min(field.max, 5) }),
        extreme(field.of).map((v) => Array.from({ length: field.max }, () => v)))
      break
    case 'object':
      arbs.push(extremeObject(field.fields, field.sample))
      break
    case 'custom':
      return fc.constant(undefined)
  }
  return fc.oneof(...arbs)
}

/** A valid object with one to four fields (optional ones too) set to edge values. */
export function extremeObject(fields: Fields, valid: Record<string, unknown>): fc.Arbitrary<Record<string, unknown>> {
  const names = Object.keys(fields).filter((n) => fields[n]!.t !== 'custom')
  // Only custom fields (a PIN): they have no edges of their own, so the valid body is the case.
  if (!names.length) return fc.constant({ ...valid })
  return fc.array(fc.constantFrom(...names).chain((n) => extreme(fields[n]!).map((v): [string, unknown] => [n, v])), { minLength: 1, maxLength: 4 })
    .map((edges) => ({ ...valid, ...Object.fromEntries(edges) }))
}
