import { z } from 'zod';

// Control characters (C0, DEL, C1) are never part of what a person types into a name.
const control = /\p{Cc}/u;
// In notes a line break and a tab are kept; every other control character is refused.
const controlInNotes = /[^\P{Cc}\n\r\t]/u;
// Something a reader can see: not only spaces, joiners, direction marks or other format characters.
const visible = /[^\p{Z}\p{Cf}\s]/u;

/** A name or short reference a person reads: trimmed, visible, without control characters. */
export function nameText(
  message: string,
  { min = 1, max = 120, tooLong }: { min?: number; max?: number; tooLong?: string } = {},
) {
  return z
    .string()
    .trim()
    .min(min, { message })
    .max(max, tooLong === undefined ? undefined : { message: tooLong })
    .refine((value) => !control.test(value), { message: 'cannot hold control characters' })
    .refine((value) => value === '' || visible.test(value), {
      message: 'must have characters a reader can see',
    });
}

/**
 * A note in the user's words: line breaks and tabs kept, other control characters refused; with
 * `min`, at least that many characters (`message` says what to write).
 */
export function noteText(
  max: number,
  { min = 0, message }: { min?: number; message?: string } = {},
) {
  return z
    .string()
    .trim()
    .min(min, message === undefined ? undefined : { message })
    .max(max)
    .refine((value) => !controlInNotes.test(value), {
      message: 'cannot hold control characters (line breaks and tabs are fine)',
    });
}
