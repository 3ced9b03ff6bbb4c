import { PASSWORD_MIN_LENGTH } from '@emberline/contracts/auth';

export const newPasswordHint = `At least ${PASSWORD_MIN_LENGTH} characters. A few unrelated words make a strong password.`;
