import { useState } from 'react';
import {
  utilizationRecordInputSchema,
  type UtilizationImportPreview,
} from '@emberline/contracts/fleet';
import { useDropzone } from 'react-dropzone';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, NumberInput } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine } from '../../../components/ui/page';
import { Pager } from '../../../components/ui/pager';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { formatCount, formatDate, formatHours } from '../../../lib/format';
import {
  useAddUtilization,
  useImportUtilization,
  usePreviewUtilizationImport,
  UTILIZATION_PAGE_SIZE,
  useUtilization,
} from '../api/engines';

function RecordForm({ engineId }: { engineId: string }) {
  const add = useAddUtilization(engineId);
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const form = useZodForm(utilizationRecordInputSchema, {
    defaultValues: { periodStart: '', periodEnd: '' },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((values) => {
    setMessage(null);
    add.mutate(values, {
      onSuccess: () => {
        form.reset({ periodStart: '', periodEnd: '' });
        setMessage({
          tone: 'success',
          text: `Recorded ${values.cycles} cycles and ${values.hours} hours from ${formatDate(values.periodStart)} to ${formatDate(values.periodEnd)}.`,
        });
      },
      onError: (error) => {
        const text = applyServerErrors(form, error);
        if (text) setMessage({ tone: 'error', text });
      },
    });
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="flex flex-col gap-3"
      aria-label="Record utilization"
    >
      <h3 className="font-semibold">Record a period</h3>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <div className="grid grid-cols-2 gap-3 lg:grid-cols-4">
        <Field label="From" error={errors.periodStart}>
          {(props) => <DateInput {...props} {...form.register('periodStart')} />}
        </Field>
        <Field label="To" error={errors.periodEnd}>
          {(props) => <DateInput {...props} {...form.register('periodEnd')} />}
        </Field>
        <Field label="Cycles" error={errors.cycles}>
          {(props) => (
            <NumberInput {...props} {...form.register('cycles', { valueAsNumber: true })} />
          )}
        </Field>
        <Field label="Hours" error={errors.hours}>
          {(props) => (
            <NumberInput
              {...props}
              kind="hours"
              {...form.register('hours', { valueAsNumber: true })}
            />
          )}
        </Field>
      </div>
      <Button type="submit" variant="secondary" busy={add.isPending} className="self-start">
        Record
      </Button>
    </form>
  );
}

function CsvImport({ engineId }: { engineId: string }) {
  const preview = usePreviewUtilizationImport(engineId);
  const commit = useImportUtilization(engineId);
  const [file, setFile] = useState<File | null>(null);
  const [result, setResult] = useState<UtilizationImportPreview | null>(null);
  const dropzone = useDropzone({
    accept: { 'text/csv': ['.csv'], 'text/plain': ['.txt'] },
    maxFiles: 1,
    maxSize: 2 * 1024 * 1024,
    onDrop: (accepted, rejected) => {
      commit.reset();
      setResult(null);
      const chosen = accepted[0];
      if (!chosen) {
        preview.reset();
        setFile(null);
        if (rejected[0])
          setResult({
            accepted: [],
            refused: [
              {
                line: 0,
                text: rejected[0].file.name,
                reason: 'choose one CSV file of at most 2 MB',
              },
            ],
          });
        return;
      }
      setFile(chosen);
      preview.mutate(chosen, { onSuccess: setResult });
    },
  });

  return (
    <section className="flex flex-col gap-3" aria-label="Import utilization from CSV">
      <h3 className="font-semibold">Import from a CSV file</h3>
      <p className="text-sm text-soot-600">
        One period a line under a header naming{' '}
        <code className="font-mono">period_start, period_end, cycles, hours</code>; dates as
        YYYY-MM-DD. You see what will be taken before anything is saved.
      </p>
      <div
        {...dropzone.getRootProps({
          className: `cursor-pointer rounded-lg border-2 border-dashed px-4 py-6 text-center text-sm ${dropzone.isDragActive ? 'border-ember-500 bg-ember-50' : 'border-soot-300 bg-soot-50'}`,
        })}
      >
        <input {...dropzone.getInputProps({ 'aria-label': 'Utilization CSV file' })} />
        {file ? (
          <span className="font-medium">{file.name}</span>
        ) : (
          'Drop a CSV file here, or press to choose one'
        )}
      </div>
      {preview.isPending ? <LoadingLine label="Reading the file…" /> : null}
      {preview.error ? <Notice tone="error">{preview.error.message}</Notice> : null}
      {commit.data ? (
        <Notice tone="success">
          Imported {commit.data.saved} period{commit.data.saved === 1 ? '' : 's'}.
        </Notice>
      ) : null}
      {commit.error ? <Notice tone="error">{commit.error.message}</Notice> : null}
      {result && !commit.data ? (
        <div className="flex flex-col gap-3" data-testid="import-preview">
          <p className="text-sm">
            <strong>{result.accepted.length}</strong> line{result.accepted.length === 1 ? '' : 's'}{' '}
            will be taken; <strong>{result.refused.length}</strong> refused.
          </p>
          {result.refused.length > 0 ? (
            <ul className="list-inside list-disc text-sm text-red-800">
              {result.refused.map((line) => (
                <li key={`${line.line}-${line.text}`}>
                  {line.line > 0 ? `Line ${line.line}: ` : ''}
                  {line.reason} <span className="font-mono text-xs text-soot-600">{line.text}</span>
                </li>
              ))}
            </ul>
          ) : null}
          {result.accepted.length > 0 && file ? (
            <Button
              className="self-start"
              busy={commit.isPending}
              onClick={() => commit.mutate(file)}
            >
              Import {result.accepted.length} good line{result.accepted.length === 1 ? '' : 's'}
            </Button>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

export function UtilizationPanel({
  engineId,
  canManage,
}: {
  engineId: string;
  canManage: boolean;
}) {
  const [page, setPage] = useState(1);
  const utilization = useUtilization(engineId, page);
  return (
    <div className="flex flex-col gap-6">
      {canManage ? (
        <div className="grid gap-6 lg:grid-cols-2">
          <RecordForm engineId={engineId} />
          <CsvImport engineId={engineId} />
        </div>
      ) : null}
      {utilization.isPending ? (
        <LoadingLine />
      ) : utilization.error ? (
        <Notice tone="error">{utilization.error.message}</Notice>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <caption className="mb-2 text-left font-semibold">
              Utilization history, newest first
            </caption>
            <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
              <tr>
                <th scope="col" className="py-2 pr-4">
                  From
                </th>
                <th scope="col" className="py-2 pr-4">
                  To
                </th>
                <th scope="col" className="py-2 pr-4 text-right">
                  Cycles
                </th>
                <th scope="col" className="py-2 pr-4 text-right">
                  Hours
                </th>
                <th scope="col" className="py-2">
                  Source
                </th>
              </tr>
            </thead>
            <tbody>
              {utilization.data.items.map((record) => (
                <tr key={record.id} className="border-b border-soot-100">
                  <td className="py-1.5 pr-4">{formatDate(record.periodStart)}</td>
                  <td className="py-1.5 pr-4">{formatDate(record.periodEnd)}</td>
                  <td className="py-1.5 pr-4 text-right font-mono">{formatCount(record.cycles)}</td>
                  <td className="py-1.5 pr-4 text-right font-mono">{formatHours(record.hours)}</td>
                  <td className="py-1.5 text-soot-600">{record.source}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {utilization.data.items.length === 0 ? (
            <p className="py-3 text-sm text-soot-600">No utilization recorded yet.</p>
          ) : (
            <Pager
              page={page}
              pageSize={UTILIZATION_PAGE_SIZE}
              total={utilization.data.total}
              noun={['record', 'records']}
              onPage={setPage}
            />
          )}
        </div>
      )}
    </div>
  );
}
