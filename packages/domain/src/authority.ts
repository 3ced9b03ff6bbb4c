import type { Authorisation } from '@emberline/contracts/users';
import { dayWords } from './dates';

/**
 * Whether an engineer may sign for an engine of `modelId` on `today` (DESIGN §5.5): a current
 * authorisation that names the model. The refusal says why, in the signer's words.
 */
export function authorityToSign(
  authorisation: Authorisation | null,
  modelId: string,
  today: string,
): { ref: string } | { refused: string } {
  if (!authorisation)
    return {
      refused: 'You hold no authorisation to sign: an administrator records it on your account.',
    };
  if (authorisation.expiresOn < today)
    return {
      refused: `Your authorisation ${authorisation.ref} expired on ${dayWords(authorisation.expiresOn)}: an administrator must renew it before you sign.`,
    };
  if (!authorisation.models.includes(modelId))
    return {
      refused: `Your authorisation ${authorisation.ref} does not cover this engine model: an administrator must add it before you sign.`,
    };
  return { ref: authorisation.ref };
}
