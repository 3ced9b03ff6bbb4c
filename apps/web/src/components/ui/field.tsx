import {
  useId,
  useState,
  type InputHTMLAttributes,
  type Ref,
  type ReactNode,
  type SelectHTMLAttributes,
} from 'react';
import { formatDate } from '../../lib/format';
import type { FieldError, UseFormRegisterReturn } from 'react-hook-form';

interface FieldProps {
  label: string;
  error?: FieldError | undefined;
  hint?: ReactNode;
  children: (props: {
    id: string;
    'aria-invalid': boolean;
    'aria-describedby': string | undefined;
  }) => ReactNode;
}

/** A labelled form field with its hint and its error shown beside it. */
export function Field({ label, error, hint, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-soot-800">
        {label}
      </label>
      {children({ id, 'aria-invalid': Boolean(error), 'aria-describedby': describedBy })}
      {hint ? (
        <p id={hintId} className="text-xs text-soot-600">
          {hint}
        </p>
      ) : null}
      {error?.message ? (
        <p id={errorId} role="alert" className="text-sm text-red-700">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}

const control =
  'w-full rounded-md border border-soot-300 bg-white px-3 py-2 text-sm text-soot-900 placeholder:text-soot-500 aria-[invalid=true]:border-red-600';

export function Input(props: InputHTMLAttributes<HTMLInputElement>) {
  return <input {...props} className={`${control} ${props.className ?? ''}`} />;
}

/**
 * A day field. The browser shows the day in the order of its own settings (2/12/2026 or
 * 12/2/2026); beneath it the product says the day it took in its one format ("12 Feb 2026"), so
 * the hint always matches what the field holds.
 */
export function DateInput({
  ref,
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { ref?: Ref<HTMLInputElement> }) {
  const [day, setDay] = useState('');
  const echoId = useId();
  return (
    <>
      <input
        {...props}
        className={`${control} ${props.className ?? ''}`}
        type="date"
        aria-describedby={[props['aria-describedby'], echoId].filter(Boolean).join(' ')}
        ref={(node: HTMLInputElement | null) => {
          if (typeof ref === 'function') ref(node);
          else if (ref) ref.current = node;
          // The form fills the field through its ref: read the day it was given.
          if (node && node.value !== day) setDay(node.value);
        }}
        onChange={(event) => {
          setDay(event.target.value);
          props.onChange?.(event);
        }}
      />
      <span id={echoId} className="text-xs text-soot-600" data-testid="date-echo">
        {day ? `Reads ${formatDate(day)}` : 'No day chosen yet'}
      </span>
    </>
  );
}

export function Select(props: SelectHTMLAttributes<HTMLSelectElement>) {
  return <select {...props} className={`${control} ${props.className ?? ''}`} />;
}

/** A number field for whole counts (cycles, positions) or hours to one decimal; never below `min` (0). */
export function NumberInput({
  kind = 'count',
  ...props
}: InputHTMLAttributes<HTMLInputElement> & { kind?: 'count' | 'hours' }) {
  return (
    <Input
      type="number"
      min="0"
      step={kind === 'hours' ? '0.1' : '1'}
      inputMode={kind === 'hours' ? 'decimal' : 'numeric'}
      {...props}
    />
  );
}

/**
 * A labelled number that may be left empty: a limit, a measured value, a count. `registration`
 * is the form's `register(name, { setValueAs: emptyToNullNumber })`, so that empty reads as null.
 */
export function OptionalNumberField({
  label,
  error,
  registration,
  whole = false,
}: {
  label: string;
  error?: FieldError | undefined;
  registration: UseFormRegisterReturn;
  whole?: boolean;
}) {
  return (
    <Field label={label} error={error}>
      {(props) => (
        <Input
          {...props}
          type="number"
          min="0"
          step={whole ? '1' : 'any'}
          inputMode={whole ? 'numeric' : 'decimal'}
          {...registration}
        />
      )}
    </Field>
  );
}
