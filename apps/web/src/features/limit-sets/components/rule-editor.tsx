import { unitSymbols } from '@emberline/domain/units';
import { formatKey } from '../../../lib/format';
import { useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import {
  beyondActionKinds,
  damageTypes,
  limitUnits,
  measures,
  type Rule,
} from '@emberline/contracts/limits';
import { ruleProblems } from '@emberline/domain/rules';
import { Button } from '../../../components/ui/button';
import { Field, Input, OptionalNumberField, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { emptyToNullNumber, useZodForm } from '../../../lib/form';
import { beyondActionLabels, ruleFormSchema, toRule, type RuleForm } from '../lib/rule-form';

type NumberName =
  | 'serviceableMax'
  | 'repeatMax'
  | 'repeatCycles'
  | 'repeatHours'
  | 'repeatDays'
  | 'beyondCycles'
  | 'beyondHours'
  | 'maxPerAirfoil'
  | 'maxTotalPerAirfoil'
  | 'maxAirfoilsPerRow'
  | 'maxAdjacentAirfoils';

/**
 * One rule in a form, validated by the shared schema and then by the domain's consistency checks
 * against the model's rows and the draft's other rules, before it is sent; the server checks the
 * whole draft again when it is saved.
 */
export function RuleEditor({
  initial,
  isNew,
  rows,
  otherRules,
  saving,
  serverError,
  onSave,
  onCancel,
}: {
  initial: RuleForm;
  isNew: boolean;
  rows: EngineModelRow[];
  otherRules: Rule[];
  saving: boolean;
  serverError: string;
  onSave: (rule: Rule) => void;
  onCancel: () => void;
}) {
  const form = useZodForm(ruleFormSchema, { defaultValues: initial });
  const { errors } = form.formState;
  const [problem, setProblem] = useState('');
  const [rowKey, unit, beyondKind] = form.watch(['row', 'unit', 'beyondKind']);
  const row = rows.find((candidate) => candidate.key === rowKey);
  const unitWord = unit === 'count' ? '' : ` (${unitSymbols[unit]})`;

  const number = (name: NumberName, label: string, whole = false) => (
    <OptionalNumberField
      label={label}
      error={errors[name]}
      whole={whole}
      registration={form.register(name, { setValueAs: emptyToNullNumber })}
    />
  );

  const onSubmit = form.handleSubmit((values) => {
    const rule = toRule(values);
    const problems = ruleProblems([...otherRules, rule], rows);
    const found = problems[problems.length - 1];
    if (found) return setProblem(found);
    setProblem('');
    onSave(rule);
  });

  return (
    <form
      noValidate
      aria-label={isNew ? 'New rule' : `Rule ${initial.title || initial.id}`}
      onSubmit={(event) => void onSubmit(event)}
      className="flex flex-col gap-4 rounded-md border border-ember-200 bg-ember-50/40 p-4"
    >
      <h3 className="font-semibold">
        {isNew ? 'New rule' : `Change the rule “${initial.title || initial.id}”`}
      </h3>
      <Notice tone="caution">{cautions.limits}</Notice>
      {problem || serverError ? <Notice tone="error">{problem || serverError}</Notice> : null}
      <div className="grid gap-3 md:grid-cols-4">
        <div className="md:col-span-3">
          <Field
            label="Title"
            error={errors.title}
            hint="What people read the rule by, e.g. “Cracks at the blade edges”"
          >
            {(props) => <Input {...props} {...form.register('title')} />}
          </Field>
        </div>
        <Field label="Rule id" error={errors.id} hint="Unique in the revision">
          {(props) => <Input {...props} {...form.register('id')} />}
        </Field>
        <Field label="Row" error={errors.row}>
          {(props) => (
            <Select
              {...props}
              {...form.register('row', {
                onChange: (event: { target: { value: string } }) => {
                  const next = rows.find((candidate) => candidate.key === event.target.value);
                  form.setValue('zones', [next?.zones[0] ?? '*']);
                },
              })}
            >
              {rows.map((candidate) => (
                <option key={candidate.key} value={candidate.key}>
                  {candidate.label}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Damage" error={errors.damage}>
          {(props) => (
            <Select {...props} {...form.register('damage')}>
              {damageTypes.map((damage) => (
                <option key={damage} value={damage}>
                  {formatKey(damage)}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <div className="grid grid-cols-2 gap-2">
          <Field label="Measure" error={errors.measure}>
            {(props) => (
              <Select {...props} {...form.register('measure')}>
                {measures.map((measure) => (
                  <option key={measure} value={measure}>
                    {measure}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          <Field label="Unit" error={errors.unit}>
            {(props) => (
              <Select {...props} {...form.register('unit')}>
                {limitUnits.map((candidate) => (
                  <option key={candidate} value={candidate}>
                    {candidate === 'count' ? 'count' : unitSymbols[candidate]}
                  </option>
                ))}
              </Select>
            )}
          </Field>
        </div>
      </div>
      <fieldset>
        <legend className="mb-1 text-sm font-medium">Zones</legend>
        {errors.zones?.message ? (
          <p role="alert" className="mb-1 text-sm text-red-700">
            {errors.zones.message}
          </p>
        ) : null}
        <div className="flex flex-wrap gap-3 text-sm">
          <label className="flex items-center gap-1">
            <input type="checkbox" value="*" {...form.register('zones')} /> every zone
          </label>
          {(row?.zones ?? []).map((zone) => (
            <label key={zone} className="flex items-center gap-1">
              <input type="checkbox" value={zone} {...form.register('zones')} /> {formatKey(zone)}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="grid gap-3 md:grid-cols-5">
        {number('serviceableMax', `Serviceable up to${unitWord}`)}
        {number('repeatMax', `Repeat inspection up to${unitWord}`)}
        {number('repeatCycles', 'Repeat within cycles', true)}
        {number('repeatHours', 'or hours')}
        {number('repeatDays', 'or days', true)}
      </div>
      <div className="grid gap-3 md:grid-cols-4">
        <Field label="Beyond the limits" error={errors.beyondKind}>
          {(props) => (
            <Select {...props} {...form.register('beyondKind')}>
              <option value="">No action given (goes to review)</option>
              {beyondActionKinds.map((kind) => (
                <option key={kind} value={kind}>
                  {beyondActionLabels[kind]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        {beyondKind === 'remove-within' ? (
          <>
            {number('beyondCycles', 'Remove within cycles', true)}
            {number('beyondHours', 'or hours')}
          </>
        ) : null}
        <label className="flex items-center gap-2 self-end pb-2 text-sm">
          <input type="checkbox" {...form.register('notPermitted')} />
          Not permitted (any amount is beyond limits)
        </label>
      </div>
      <div className="grid gap-3 md:grid-cols-4">
        {number('maxPerAirfoil', 'At most per airfoil (count)', true)}
        {number('maxTotalPerAirfoil', `Total per airfoil at most${unitWord}`)}
        {number('maxAirfoilsPerRow', 'Airfoils in the row at most', true)}
        {number('maxAdjacentAirfoils', 'Adjacent airfoils at most', true)}
      </div>
      <Field
        label="Manual reference"
        error={errors.reference}
        hint="Chapter, figure or paragraph of the approved manual this rule comes from"
      >
        {(props) => <Input {...props} {...form.register('reference')} />}
      </Field>
      <div className="flex gap-2">
        <Button type="submit" busy={saving}>
          {isNew ? 'Add the rule' : 'Save the rule'}
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
