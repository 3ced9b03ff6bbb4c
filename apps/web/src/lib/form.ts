import { zodResolver } from '@hookform/resolvers/zod';
import {
  useForm,
  type FieldValues,
  type Path,
  type UseFormReturn,
  type UseFormProps,
} from 'react-hook-form';
import type { z } from 'zod';
import { ApiError } from './api-client';

/** A react-hook-form form validated by a contract schema, the same one the server uses. */
export function useZodForm<TSchema extends z.ZodType<FieldValues, FieldValues>>(
  schema: TSchema,
  options?: Omit<UseFormProps<z.input<TSchema>, unknown, z.output<TSchema>>, 'resolver'>,
) {
  return useForm<z.input<TSchema>, unknown, z.output<TSchema>>({
    ...options,
    resolver: zodResolver(schema),
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
}

/**
 * Puts the server's field errors on the form's fields; returns the message for the form as a whole
 * (the error's own message when no field was named).
 */
export function applyServerErrors<T extends FieldValues>(
  form: UseFormReturn<T, unknown, FieldValues>,
  error: unknown,
): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  const fieldErrors = error.fieldErrors;
  let placed = false;
  if (fieldErrors) {
    for (const [name, messages] of Object.entries(fieldErrors.fields)) {
      if (form.getValues(name as Path<T>) !== undefined) {
        form.setError(name as Path<T>, { type: 'server', message: messages[0] });
        placed = true;
      }
    }
  }
  return placed ? (fieldErrors?.form[0] ?? '') : error.message;
}

/** For an optional text input whose contract value is null when left empty. */
export const emptyToNull = (value: unknown) => (value === '' ? null : value);

/** For an optional number input whose contract value is null when left empty. */
export const emptyToNullNumber = (value: unknown) =>
  value === '' || value === null || value === undefined ? null : Number(value);
