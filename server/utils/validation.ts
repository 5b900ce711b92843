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

/** `readValidatedBody(event, parseWith(Body))`: 400 with `data.fields` naming each bad field. */
export function parseWith<S extends z.ZodType>(schema: S) {
  return (input: unknown): z.output<S> => {
    const result = schema.safeParse(input)
    if (!result.success) {
      const { message, fields } = describeIssues(result.error.issues)
      throw new FieldError(message, fields)
    }
    return result.data
  }
}
