import { useId, useState } from 'react';
import { useController, type UseFormReturn } from 'react-hook-form';
import { MM_PER_INCH } from '@emberline/domain/units';
import type { FindingDetails, SeriesEntry } from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { damageTypes } from '@emberline/contracts/limits';
import { Field, Input, OptionalNumberField, Select } from '../../../components/ui/field';
import { emptyToNull, emptyToNullNumber } from '../../../lib/form';
import { formatDate, formatKey } from '../../../lib/format';

export type FindingDetailsForm = UseFormReturn<FindingDetails, unknown, FindingDetails>;

type NumberName =
  'lengthMm' | 'areaMm2' | 'uncertaintyMm' | 'uncertaintyMm2' | 'widthMm' | 'depthMm' | 'count';
type LengthName = 'lengthMm' | 'uncertaintyMm' | 'widthMm' | 'depthMm';
type LengthUnit = 'mm' | 'in';

const toMm = (value: number, unit: LengthUnit) => (unit === 'in' ? value * MM_PER_INCH : value);
/** A stored mm value as the inspector reads it in the chosen unit (four places in inches). */
const shown = (mm: number | null, unit: LengthUnit) =>
  mm === null || !Number.isFinite(mm)
    ? ''
    : String(Number((unit === 'in' ? mm / MM_PER_INCH : mm).toFixed(unit === 'in' ? 5 : 4)));

/**
 * A length entered in mm or in and kept in mm: the form (and the server) always hold millimetres;
 * the field shows what the inspector typed, and the stored value again when the unit changes.
 */
function LengthField({
  form,
  name,
  label,
  unit,
}: {
  form: FindingDetailsForm;
  name: LengthName;
  label: string;
  unit: LengthUnit;
}) {
  const { field, fieldState } = useController({ control: form.control, name });
  const stored = field.value ?? null;
  const [text, setText] = useState(() => shown(stored, unit));
  // The unit and the stored value the text stands for.
  const [synced, setSynced] = useState<{ unit: LengthUnit; mm: number | null }>({
    unit,
    mm: stored,
  });
  // The unit changed, or the form was reset or filled from elsewhere: show the stored value
  // (state adjusted while rendering, as React advises for state derived from props).
  if (unit !== synced.unit || !Object.is(stored, synced.mm)) {
    setText(shown(stored, unit));
    setSynced({ unit, mm: stored });
  }
  return (
    <Field label={`${label} (${unit})`} error={fieldState.error}>
      {(props) => (
        <Input
          {...props}
          type="number"
          min="0"
          step="any"
          inputMode="decimal"
          name={field.name}
          value={text}
          onBlur={field.onBlur}
          onChange={(event) => {
            const next = event.target.value;
            const value = next.trim() === '' ? null : Number(next);
            const mm = value === null || !Number.isFinite(value) ? value : toMm(value, unit);
            setText(next);
            setSynced({ unit, mm });
            field.onChange(mm);
          }}
        />
      )}
    </Field>
  );
}

/**
 * Row, position, zone, damage, how it was measured and the entered values of one finding: the
 * fields the recording form and the correcting form share. The zone list follows the row.
 */
export function FindingFields({
  form,
  rows,
  candidates,
}: {
  form: FindingDetailsForm;
  rows: EngineModelRow[];
  candidates: SeriesEntry[] | undefined;
}) {
  const { errors } = form.formState;
  const number = (name: NumberName, label: string, whole = false) => (
    <OptionalNumberField
      label={label}
      error={errors[name]}
      whole={whole}
      registration={form.register(name, { setValueAs: emptyToNullNumber })}
    />
  );
  const [rowKey, method, previous] = form.watch(['row', 'method', 'previousFindingId']);
  const [unit, setUnit] = useState<LengthUnit>('mm');
  const unitGroup = useId();
  const length = (name: LengthName, label: string) => (
    <LengthField form={form} name={name} label={label} unit={unit} />
  );
  const row = rows.find((candidate) => candidate.key === rowKey);
  const zones = row?.zones ?? [];
  return (
    <>
      <div className="grid grid-cols-2 gap-2">
        <Field label="Row" error={errors.row}>
          {(props) => (
            <Select
              {...props}
              {...form.register('row', {
                onChange: (event: { target: { value: string } }) => {
                  const next = rows.find((candidate) => candidate.key === event.target.value);
                  form.setValue('zone', next?.zones[0] ?? '');
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
        <Field label={`Position${row ? ` (1–${row.count})` : ''}`} error={errors.position}>
          {(props) => (
            <Input
              {...props}
              type="number"
              min={1}
              max={row?.count}
              step="1"
              inputMode="numeric"
              {...form.register('position', { valueAsNumber: true })}
            />
          )}
        </Field>
        <Field label="Zone" error={errors.zone}>
          {(props) => (
            <Select {...props} {...form.register('zone')}>
              {zones.map((zone) => (
                <option key={zone} value={zone}>
                  {formatKey(zone)}
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
      </div>
      <fieldset className="flex gap-3 text-sm">
        <legend className="sr-only">Measured by</legend>
        <label className="flex items-center gap-1">
          <input type="radio" value="image" {...form.register('method')} />
          On the image
        </label>
        <label className="flex items-center gap-1">
          <input type="radio" value="probe" {...form.register('method')} />
          With the probe
        </label>
      </fieldset>
      <fieldset className="flex gap-3 text-sm">
        <legend className="mr-1 float-left text-soot-700">Lengths entered in</legend>
        {(['mm', 'in'] as const).map((choice) => (
          <label key={choice} className="flex items-center gap-1">
            <input
              type="radio"
              name={unitGroup}
              checked={unit === choice}
              onChange={() => setUnit(choice)}
            />
            {choice === 'mm' ? 'millimetres' : 'inches'}
          </label>
        ))}
      </fieldset>
      {method === 'probe' ? (
        <div className="grid grid-cols-2 gap-2">
          {length('lengthMm', 'Length')}
          {length('uncertaintyMm', '±')}
          {number('areaMm2', 'Area (mm²)')}
          {number('uncertaintyMm2', '± (mm²)')}
        </div>
      ) : null}
      <div className="grid grid-cols-3 gap-2">
        {length('depthMm', 'Depth')}
        {length('widthMm', 'Width')}
        {number('count', 'Count', true)}
      </div>
      {(candidates && candidates.length > 0) || previous ? (
        <Field label="Same damage as an earlier finding?" error={errors.previousFindingId}>
          {(props) => (
            <Select {...props} {...form.register('previousFindingId', { setValueAs: emptyToNull })}>
              <option value="">No: new damage</option>
              {previous && !candidates?.some((candidate) => candidate.findingId === previous) ? (
                <option value={previous}>The finding linked before</option>
              ) : null}
              {(candidates ?? []).map((candidate) => (
                <option key={candidate.findingId} value={candidate.findingId}>
                  {formatDate(candidate.inspectionDate)} (CSN {candidate.csn}): F{candidate.number}{' '}
                  {formatKey(candidate.zone)}
                  {candidate.lengthMm !== null ? `, ${candidate.lengthMm.toFixed(2)} mm` : ''}
                  {candidate.areaMm2 !== null ? `, ${candidate.areaMm2.toFixed(1)} mm²` : ''}
                </option>
              ))}
            </Select>
          )}
        </Field>
      ) : null}
      <Field label="Notes" error={errors.notes}>
        {(props) => (
          <textarea
            {...props}
            rows={2}
            className="rounded-md border border-soot-300 px-3 py-2 text-sm"
            {...form.register('notes')}
          />
        )}
      </Field>
    </>
  );
}
