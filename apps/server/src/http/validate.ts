import type { RequestHandler } from 'express';
import type { z } from 'zod';
import type { FieldErrors } from '@emberline/contracts/errors';
import { AppError } from './app-error';

interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/** Field errors in the contract's shape, from a zod error. */
export function toFieldErrors(error: z.ZodError): FieldErrors {
  // A Map, so that a key such as "__proto__" in the input stays an ordinary name.
  const fields = new Map<string, string[]>();
  const add = (name: string, message: string) =>
    fields.set(name, [...(fields.get(name) ?? []), message]);
  const form: string[] = [];
  for (const issue of error.issues) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        const name = [...issue.path, key].join('.');
        add(name, `"${key}" is not a field this request takes`);
      }
      continue;
    }
    const name = issue.path.join('.');
    if (name) add(name, issue.message);
    else form.push(issue.message);
  }
  return { fields: Object.fromEntries(fields), form };
}

function firstMessage(details: FieldErrors): string {
  const [field, messages] = Object.entries(details.fields)[0] ?? [];
  if (field && messages?.[0]) return `${field}: ${messages[0]}`;
  return details.form[0] ?? 'The request is not valid';
}

/**
 * Parses body, query and params with the contract schemas and puts the parsed values in
 * `res.locals` (Express 5 makes `req.query` read-only). A failure is a 400 naming each field.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input = part === 'body' ? (req.body ?? {}) : req[part];
      const result = schema.safeParse(input);
      if (!result.success) {
        const details = toFieldErrors(result.error);
        throw AppError.badRequest(firstMessage(details), details);
      }
      res.locals[part] = result.data;
    }
    next();
  };
}
