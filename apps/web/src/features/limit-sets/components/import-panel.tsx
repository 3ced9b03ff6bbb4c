import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useImportRules, usePreviewImport } from '../api/limit-sets';

/**
 * Import of a rules file (CSV one rule a line, or the JSON export): first a preview of what would
 * be taken and refused, then, only when nothing is refused, the replacement of the draft's rules.
 */
export function ImportPanel({ limitSetId }: { limitSetId: string }) {
  const [file, setFile] = useState<File | null>(null);
  const preview = usePreviewImport(limitSetId);
  const importing = useImportRules(limitSetId);
  const result = preview.data;
  const unit = result?.format === 'json' ? 'Rule' : 'Line';
  return (
    <div className="flex flex-col gap-3 text-sm">
      <label className="flex flex-col gap-1">
        <span className="font-medium">Rules file (CSV or JSON)</span>
        <input
          type="file"
          accept=".csv,.json,text/csv,application/json"
          onChange={(event) => {
            const chosen = event.target.files?.[0] ?? null;
            setFile(chosen);
            importing.reset();
            if (chosen) preview.mutate(chosen);
          }}
        />
      </label>
      <p className="text-xs text-soot-600">
        CSV: a header row, then one rule a line, with the columns of the CSV export (units written
        out: mm, in, mm2, in2, count; zones separated by “;”). Nothing is saved until you replace
        the rules, and a file with a refused line is not taken at all.
      </p>
      {preview.isPending ? <p role="status">Reading the file…</p> : null}
      {preview.error ? <Notice tone="error">{preview.error.message}</Notice> : null}
      {result ? (
        <div className="flex flex-col gap-2" data-testid="import-preview">
          <p>
            {result.accepted.length} rule{result.accepted.length === 1 ? '' : 's'} would be taken,{' '}
            {result.refused.length} refused. The draft has {result.currentRuleCount} rules now.
          </p>
          {result.refused.length > 0 ? (
            <table className="w-full text-left text-xs">
              <caption className="sr-only">Refused entries</caption>
              <thead>
                <tr className="border-b border-soot-200">
                  <th scope="col" className="py-1 pr-2">
                    {unit}
                  </th>
                  <th scope="col" className="py-1 pr-2">
                    Why it is refused
                  </th>
                  <th scope="col" className="py-1">
                    Text
                  </th>
                </tr>
              </thead>
              <tbody>
                {result.refused.map((line) => (
                  <tr key={`${line.line}-${line.reason}`} className="border-b border-soot-100">
                    <td className="py-1 pr-2 font-mono">{line.line || '—'}</td>
                    <td className="py-1 pr-2 text-red-800">{line.reason}</td>
                    <td className="max-w-md truncate py-1 font-mono">{line.text}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : null}
          {result.refused.length > 0 ? (
            <Notice tone="caution">
              Correct the refused entries in the file and choose it again: nothing is taken while
              any is refused.
            </Notice>
          ) : null}
          {importing.error ? <Notice tone="error">{importing.error.message}</Notice> : null}
          {importing.isSuccess ? (
            <Notice tone="success">
              The draft now has the {importing.data.rules.length} rules of the file.
            </Notice>
          ) : (
            <Button
              type="button"
              className="self-start"
              disabled={!file || result.refused.length > 0 || result.accepted.length === 0}
              busy={importing.isPending}
              onClick={() => file && importing.mutate(file)}
            >
              Replace the {result.currentRuleCount} rules with these {result.accepted.length}
            </Button>
          )}
        </div>
      ) : null}
    </div>
  );
}
