import { useState } from 'react';
import { bookingInputSchema, type EngineDue } from '@emberline/contracts/planning';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatDate, formatDateTime } from '../../../lib/format';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { useBook } from '../api/planning';

/**
 * The planner's booking of an engine's next inspection: a day on or before the due date (an
 * overdue engine from today on) and a note. The server refuses a day in the past or after the
 * due date, in words, at the field.
 */
export function BookingForm({
  engineId,
  serialNumber,
  due,
}: {
  engineId: string;
  serialNumber: string;
  due: EngineDue;
}) {
  const book = useBook(engineId);
  const [formError, setFormError] = useState('');
  const form = useZodForm(bookingInputSchema, {
    defaultValues: {
      plannedDate: due.booking?.plannedDate ?? '',
      note: due.booking?.note ?? '',
    },
  });
  const { errors } = form.formState;
  return (
    <form
      aria-label={`Booking of ${serialNumber}`}
      className="flex flex-wrap items-end gap-2"
      noValidate
      onSubmit={form.handleSubmit((values) => {
        setFormError('');
        book.mutate(values, {
          onError: (error) => setFormError(applyServerErrors(form, error)),
        });
      })}
    >
      <Field
        label="Planned date"
        error={errors.plannedDate}
        hint={
          due.nextInspection?.dueDate
            ? `Due ${formatDate(due.nextInspection.dueDate)}${due.state === 'overdue' ? ' (overdue: book from today)' : ''}`
            : undefined
        }
      >
        {(props) => <DateInput {...props} {...form.register('plannedDate')} />}
      </Field>
      <Field label="Note" error={errors.note}>
        {(props) => <Input {...props} {...form.register('note')} placeholder="Slot, place, kit" />}
      </Field>
      <Button type="submit" variant="secondary" busy={book.isPending}>
        {due.booking ? 'Rebook' : 'Book'}
      </Button>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {due.booking ? (
        <p className="w-full text-xs text-soot-600">
          Booked for {formatDate(due.booking.plannedDate)} by {due.booking.bookedByName},{' '}
          {formatDateTime(due.booking.bookedAt)}
          {due.booking.afterDueDate
            ? ` — the due date moved earlier (${formatDate(due.booking.dueDateAtBooking)} → ${formatDate(due.nextInspection?.dueDate ?? null)}): rebook it.`
            : '.'}
        </p>
      ) : null}
    </form>
  );
}
