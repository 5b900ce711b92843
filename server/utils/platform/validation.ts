// Turns a zod schema into a validator for h3's readValidatedBody / getValidatedQuery /
// getValidatedRouterParams, with an error message that names the field.
import type { z } from 'zod'

export class FieldError extends Error {
  constructor(message: string, public readonly fields: Record<string, string>) {
    super(message)
  }
}

export function describeIssues(issues: readonly z.core.$ZodIssue[]): { message: string, fields: Record<string, string> } {
  const fields: Record<string, string> = {}
  for (const issue of issues) {
    const key = issue.path.map(String).join('.') || '_'
    fields[key] ??= issue.message
  }
  const message = Object.entries(fields)
    .map(([key, text]) => (key === '_' ? text : `${key}: ${text}`))
    .join('; ')
  return { message: message || 'The request is not valid.', fields }
}

/**
 * The path of the first string (value or key) holding a NUL character, anywhere in the input.
 * PostgreSQL cannot store NUL in text, so such input would otherwise fail in the database.
 */
function findNul(input: unknown): string | undefined {
  const stack: Array<[unknown, string]> = [[input, '']]
  while (stack.length) {
    const [value, path] = stack.pop()!
    if (typeof value === 'string') {
      if (value.includes('\u0000')) return path
    } else if (value && typeof value === 'object') {
      for (const [key, child] of Object.entries(value)) {
        const childPath = path ? `${path}.${key}` : key
        if (key.includes('\u0000')) return path
        stack.push([child, childPath])
      }
    }
  }
  return undefined
}

/** `readValidatedBody(event, parseWith(Body))`: 400 with `data.fields` naming each bad field. */
export function parseWith<S extends z.ZodType>(schema: S) {
  return (input: unknown): z.output<S> => {
    const nul = findNul(input)
    if (nul !== undefined) {
      const field = nul.replace(/[^\x20-\x7E]/g, '?') || '_'
      throw new FieldError(`${field === '_' ? '' : `${field}: `}must not contain the NUL character (\\0)`, { [field]: 'must not contain the NUL character' })
    }
    const result = schema.safeParse(input)
    if (!result.success) {
      const { message, fields } = describeIssues(result.error.issues)
      throw new FieldError(message, fields)
    }
    return result.data
  }
}

/** Validates input read another way (a multipart form's fields) with the same 400 that readValidatedBody gives. */
export function validateInput<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  try {
    return parseWith(schema)(input)
  } catch (err) {
    if (err instanceof FieldError) {
      throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: err.message, data: { fields: err.fields } })
    }
    throw err
  }
}

/** A 400 for one field, shaped as `parseWith`'s: the message names the field, `data.fields` holds it for forms. */
export function badField(field: string, message: string): never {
  throw createError({ statusCode: 400, statusMessage: `${field}: ${message}`, data: { fields: { [field]: message } } })
}
