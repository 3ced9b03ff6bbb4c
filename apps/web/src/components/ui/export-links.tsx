import { exportFormatLabels, type ExportFormat } from '@emberline/contracts/exports';
import { Download } from 'lucide-react';
import { apiUrl } from '../../lib/api-client';

/**
 * Download links of a table's export, one a format: `path` is the API path without the format,
 * `query` any filters the table shows.
 */
export function ExportLinks({
  label = 'Export findings',
  path,
  formats,
  query = {},
}: {
  label?: string;
  path: string;
  formats: readonly ExportFormat[];
  query?: Record<string, string | undefined>;
}) {
  const href = (format: ExportFormat) => {
    const search = new URLSearchParams({ format });
    for (const [key, value] of Object.entries(query)) if (value) search.set(key, value);
    return apiUrl(`${path}?${search.toString()}`);
  };
  return (
    <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
      <span className="flex items-center gap-1 text-soot-700">
        <Download className="size-4" aria-hidden />
        {label}:
      </span>
      {formats.map((format) => (
        <a
          key={format}
          href={href(format)}
          download
          className="font-medium text-ember-800 underline-offset-2 hover:underline"
        >
          {exportFormatLabels[format]}
        </a>
      ))}
    </p>
  );
}
