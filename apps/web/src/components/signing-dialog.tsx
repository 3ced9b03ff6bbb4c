import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import { ApiError } from '../lib/api-client';
import { Button } from './ui/button';
import { Input } from './ui/field';
import { Notice } from './ui/notice';

/**
 * Asks for the password before a signature, stating first what the signature attests (DESIGN
 * §5.5). A modal dialog: focus stays inside it, Escape closes it. A wrong password shows at the
 * field; every other refusal above the button.
 */
export function SigningDialog({
  open,
  title,
  meaning,
  summary,
  signLabel,
  busy,
  error,
  onSign,
  onClose,
}: {
  open: boolean;
  title: string;
  /** The sentence the signature attests, shown before the password is asked. */
  meaning: string;
  /** What is being signed, in words. */
  summary: ReactNode;
  signLabel: string;
  busy: boolean;
  error: unknown;
  onSign: (password: string) => void;
  onClose: () => void;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [password, setPassword] = useState('');
  const id = useId();

  useEffect(() => {
    const element = dialog.current;
    if (!element) return;
    if (open && !element.open) {
      setPassword('');
      element.showModal();
    } else if (!open && element.open) element.close();
  }, [open]);

  const passwordError =
    error instanceof ApiError ? error.fieldErrors?.fields.password?.[0] : undefined;
  const otherError =
    error && !passwordError
      ? error instanceof Error
        ? error.message
        : 'Something went wrong. Try again.'
      : null;

  return (
    <dialog
      ref={dialog}
      aria-labelledby={`${id}-title`}
      onClose={onClose}
      className="m-auto w-full max-w-lg rounded-lg border border-soot-300 p-0 shadow-xl backdrop:bg-soot-950/50"
      data-testid="signing-dialog"
    >
      <form
        className="flex flex-col gap-4 p-5"
        onSubmit={(event) => {
          event.preventDefault();
          onSign(password);
        }}
      >
        <h2 id={`${id}-title`} className="text-lg font-semibold">
          {title}
        </h2>
        <div className="text-sm">{summary}</div>
        <blockquote className="border-l-4 border-ember-600 bg-ember-50 px-3 py-2 text-sm">
          <p className="text-xs font-semibold uppercase tracking-wide text-ember-800">
            Your signature means
          </p>
          <p className="mt-1">{meaning}</p>
        </blockquote>
        <p className="text-xs text-soot-600">{cautions.dispositions}</p>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-password`} className="text-sm font-medium">
            Your password, to sign
          </label>
          <Input
            id={`${id}-password`}
            type="password"
            autoComplete="current-password"
            value={password}
            aria-invalid={Boolean(passwordError)}
            aria-describedby={passwordError ? `${id}-password-error` : undefined}
            onChange={(event) => setPassword(event.target.value)}
            autoFocus
          />
          {passwordError ? (
            <p id={`${id}-password-error`} role="alert" className="text-sm text-red-700">
              {passwordError}
            </p>
          ) : null}
        </div>
        {otherError ? <Notice tone="error">{otherError}</Notice> : null}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" busy={busy} disabled={password.length === 0}>
            {signLabel}
          </Button>
        </div>
      </form>
    </dialog>
  );
}
