import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { beyondActionKinds, type FindingEvaluation } from '@emberline/contracts/limits';
import {
  decisionKindLabels,
  decisionSchema,
  dispositionFormSchema,
  signatureMeanings,
  type Decision,
  type Disposition,
  type DispositionForm,
} from '@emberline/contracts/review';
import { defaultDecision, isConcession } from '@emberline/domain/decisions';
import { actionWords, decisionWords } from '@emberline/domain/decision-words';
import { SigningDialog } from '../../../components/signing-dialog';
import { Button } from '../../../components/ui/button';
import { Field, Input, OptionalNumberField, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { applyServerErrors, emptyToNullNumber, useZodForm } from '../../../lib/form';
import { useDispose } from '../api/review';

const verdictOf = (evaluation: FindingEvaluation | null) => ({
  category: evaluation?.category ?? ('review' as const),
  repeatInterval: evaluation?.repeatInterval ?? null,
  beyondAction: evaluation?.beyondAction ?? null,
});

export interface RecurrencePrompt {
  candidateFindingId: string;
  label: string;
}

/**
 * The engineer's decision on one finding, defaulting to what the verdict calls for. A looser
 * decision is a concession and says so; the signing dialog asks for the password. `formId` lets
 * the screen's "S" key submit it.
 */
export function DecisionForm({
  formId,
  inspectionId,
  findingId,
  findingLabel,
  evaluation,
  supersedes,
  recurrence,
  onSigned,
}: {
  formId: string;
  inspectionId: string;
  findingId: string;
  findingLabel: string;
  evaluation: FindingEvaluation | null;
  /** The current disposition this form corrects, if any. */
  supersedes: Disposition | null;
  recurrence: RecurrencePrompt | null;
  onSigned: () => void;
}) {
  const verdict = verdictOf(evaluation);
  const initial: Decision = supersedes?.decision ??
    defaultDecision(verdict) ?? { kind: 'serviceable' };
  const form = useZodForm(dispositionFormSchema, {
    shouldUnregister: true,
    defaultValues: {
      decision: initial,
      rationale: '',
      concessionRef: supersedes?.concessionRef ?? null,
      supersedesId: supersedes?.id ?? null,
      supersedeReason: supersedes ? '' : null,
      recurrence: null,
    } satisfies DispositionForm,
  });
  const dispose = useDispose(inspectionId);
  const [pending, setPending] = useState<DispositionForm | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const kind = form.watch('decision.kind');
  const watched = decisionSchema.safeParse(form.watch('decision'));
  const concession = watched.success && isConcession(watched.data, verdict);
  const errors = form.formState.errors;
  const decisionErrors = errors.decision as
    | {
        repeatInterval?: { message?: string };
        action?: { message?: string };
      }
    | undefined;

  return (
    <>
      <form
        id={formId}
        className="flex flex-col gap-3"
        noValidate
        onSubmit={form.handleSubmit((values) => {
          setFormError(null);
          dispose.reset();
          setPending(values);
        })}
      >
        <Field
          label={
            supersedes ? `Corrected decision on ${findingLabel}` : `Decision on ${findingLabel}`
          }
          hint={
            defaultDecision(verdict)
              ? `The verdict calls for: ${decisionWords(defaultDecision(verdict)!)}.`
              : 'The verdict is review: no limit decides it. Decide, or send the inspection back to be measured again.'
          }
        >
          {(props) => (
            <Select {...props} {...form.register('decision.kind')}>
              {(['serviceable', 'repeat-inspection', 'remove'] as const).map((value) => (
                <option key={value} value={value}>
                  {decisionKindLabels[value]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        {kind === 'repeat-inspection' ? (
          <fieldset className="grid gap-2 sm:grid-cols-3">
            <legend className="mb-1 text-sm font-medium">
              Repeat inspection within (the earliest governs)
            </legend>
            <OptionalNumberField
              label="Cycles"
              whole
              registration={form.register('decision.repeatInterval.cycles', {
                setValueAs: emptyToNullNumber,
              })}
            />
            <OptionalNumberField
              label="Hours"
              registration={form.register('decision.repeatInterval.hours', {
                setValueAs: emptyToNullNumber,
              })}
            />
            <OptionalNumberField
              label="Days"
              whole
              registration={form.register('decision.repeatInterval.days', {
                setValueAs: emptyToNullNumber,
              })}
            />
            {decisionErrors?.repeatInterval?.message ? (
              <p role="alert" className="text-sm text-red-700 sm:col-span-3">
                {decisionErrors.repeatInterval.message}
              </p>
            ) : null}
          </fieldset>
        ) : null}
        {kind === 'remove' ? (
          <fieldset className="grid gap-2 sm:grid-cols-3">
            <legend className="mb-1 text-sm font-medium">Removal</legend>
            <Field label="When">
              {(props) => (
                <Controller
                  control={form.control}
                  name="decision.action.kind"
                  render={({ field }) => (
                    <Select {...props} {...field}>
                      {beyondActionKinds.map((value) => (
                        <option key={value} value={value}>
                          {actionWords({ kind: value, cycles: null, hours: null }).replace(
                            /^remove within $/,
                            'remove within…',
                          )}
                        </option>
                      ))}
                    </Select>
                  )}
                />
              )}
            </Field>
            <OptionalNumberField
              label="Within cycles"
              whole
              registration={form.register('decision.action.cycles', {
                setValueAs: emptyToNullNumber,
              })}
            />
            <OptionalNumberField
              label="Within hours"
              registration={form.register('decision.action.hours', {
                setValueAs: emptyToNullNumber,
              })}
            />
            {decisionErrors?.action?.message ? (
              <p role="alert" className="text-sm text-red-700 sm:col-span-3">
                {decisionErrors.action.message}
              </p>
            ) : null}
          </fieldset>
        ) : null}
        {concession ? (
          <Notice tone="caution" title="This decision is a concession">
            It is looser than the verdict calls for. A concession needs the reference of whoever
            granted it (the type certificate holder or the authority), and is marked as one wherever
            it shows.
          </Notice>
        ) : null}
        <Field
          label={concession ? 'Concession reference (needed)' : 'Concession reference'}
          error={errors.concessionRef}
        >
          {(props) => (
            <Input
              {...props}
              {...form.register('concessionRef', { setValueAs: (value) => value || null })}
              placeholder={concession ? 'The granting reference' : 'Only for a concession'}
            />
          )}
        </Field>
        <Field label="Rationale" error={errors.rationale}>
          {(props) => (
            <Input
              {...props}
              {...form.register('rationale')}
              placeholder="Why this decision, in a few words"
            />
          )}
        </Field>
        {supersedes ? (
          <input
            type="hidden"
            {...form.register('supersedesId', { setValueAs: (value) => value || null })}
          />
        ) : null}
        {supersedes ? (
          <Field label="Why the earlier decision is corrected" error={errors.supersedeReason}>
            {(props) => <Input {...props} {...form.register('supersedeReason')} />}
          </Field>
        ) : null}
        {recurrence ? (
          <fieldset className="flex flex-col gap-1 rounded border border-soot-200 p-3 text-sm">
            <legend className="px-1 font-medium">
              Possibly the same damage as {recurrence.label}
            </legend>
            <Controller
              control={form.control}
              name="recurrence"
              render={({ field }) => (
                <div className="flex flex-wrap gap-4">
                  {(
                    [
                      ['same-damage', 'Link: it is the same damage'],
                      ['new-damage', 'Confirm it is new damage'],
                    ] as const
                  ).map(([answer, label]) => (
                    <label key={answer} className="inline-flex items-center gap-2">
                      <input
                        type="radio"
                        name={field.name}
                        checked={field.value?.answer === answer}
                        onChange={() =>
                          field.onChange({
                            candidateFindingId: recurrence.candidateFindingId,
                            answer,
                          })
                        }
                      />
                      {label}
                    </label>
                  ))}
                </div>
              )}
            />
          </fieldset>
        ) : null}
        {formError ? <Notice tone="error">{formError}</Notice> : null}
        <Button type="submit" className="self-start" aria-keyshortcuts="S">
          {supersedes ? 'Sign the correction…' : 'Sign the disposition…'}{' '}
          <kbd className="rounded border border-white/50 px-1 text-xs">S</kbd>
        </Button>
      </form>
      <SigningDialog
        open={pending !== null}
        title={`Sign the disposition of ${findingLabel}`}
        meaning={signatureMeanings.disposition}
        summary={
          pending ? (
            <p>
              <strong>{decisionWords(pending.decision as Decision)}</strong>
              {concession ? ` — a concession under ${pending.concessionRef ?? '…'}` : ''}.{' '}
              {pending.rationale}
            </p>
          ) : null
        }
        signLabel="Sign"
        busy={dispose.isPending}
        error={dispose.error}
        onClose={() => setPending(null)}
        onSign={(password) => {
          if (!pending) return;
          // Awaited rather than a mutate() callback: the signed disposition may replace this form
          // before the callback would run.
          dispose
            .mutateAsync({ findingId, input: { ...pending, password } })
            .then(() => {
              setPending(null);
              onSigned();
            })
            .catch((error: unknown) => {
              const message = applyServerErrors(form, error);
              // A refusal that is not about the password closes the dialog and shows on the form.
              if (!(error instanceof ApiError && error.fieldErrors?.fields.password)) {
                setPending(null);
                setFormError(message);
              }
            });
        }}
      />
    </>
  );
}
