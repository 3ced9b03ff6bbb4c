import { z } from 'zod';
import { beyondActionSchema, intervalSchema } from './limits';

/**
 * An engineer's decision on one finding (DESIGN §5.5): serviceable; a repeat inspection at an
 * interval (at least one of cycles, hours, days); or removal with an action (remove-within needs
 * cycles or hours).
 */
export const decisionSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('serviceable') }),
  z.strictObject({
    kind: z.literal('repeat-inspection'),
    repeatInterval: intervalSchema.refine(
      (interval) => interval.cycles !== null || interval.hours !== null || interval.days !== null,
      { message: 'Give the repeat interval in cycles, hours or days' },
    ),
  }),
  z.strictObject({
    kind: z.literal('remove'),
    action: beyondActionSchema.refine(
      (action) =>
        action.kind !== 'remove-within' || action.cycles !== null || action.hours !== null,
      { message: '"Remove within" needs a number of cycles or hours' },
    ),
  }),
]);
export type Decision = z.infer<typeof decisionSchema>;

export const decisionKindLabels: Record<Decision['kind'], string> = {
  serviceable: 'Serviceable',
  'repeat-inspection': 'Serviceable with a repeat inspection',
  remove: 'Remove from service',
};

/** The kinds of signature Emberline keeps in its append-only record (DESIGN §5.5). */
export const signatureKinds = [
  'disposition',
  'withdrawal',
  'outcome',
  'release',
  'limit-check',
  'publication',
] as const;
export type SignatureKind = (typeof signatureKinds)[number];

/** What each kind of signature attests, in the words the signer reads before signing. */
export const signatureMeanings: Record<SignatureKind, string> = {
  disposition:
    'I have compared this finding with the damage limits of the revision named and decide its disposition as stated, under my authorisation.',
  withdrawal:
    'I withdraw the current dispositions of this inspection, which returns to the inspector to be changed and submitted again.',
  outcome:
    'Every recorded finding of this inspection has a current disposition, every row its coverage and every flag my acceptance; I sign the inspection outcome stated.',
  release: 'I release this dispositioned inspection and its report to the engine’s owner.',
  'limit-check':
    'I have checked these damage limits against the approved engine manual revision they name.',
  publication: 'I publish this limit revision, which governs every inspection judged from now on.',
};
