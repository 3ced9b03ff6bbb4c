import type { BeyondAction, Category, Interval } from '@emberline/contracts/limits';
import { decisionSchema } from '@emberline/contracts/review';
import { dayWords } from '@emberline/domain/dates';
import { actionWords, decisionWords, intervalWords } from '@emberline/domain/decision-words';

const categoryNames: Record<Category, string> = {
  serviceable: 'serviceable',
  'repeat-inspection': 'repeat inspection',
  review: 'review',
  'beyond-limits': 'beyond limits',
};
const categoryWords = (category: Category) => categoryNames[category] ?? String(category);

/** What a history line needs besides the entry: how rows are called. */
export interface HistoryLabels {
  rowLabel: (key: string) => string;
}

type Values = Record<string, unknown> | null;

const words = (key: unknown) => String(key ?? '').replace(/-/g, ' ');
const mm = (value: unknown, unit = 'mm') =>
  typeof value === 'number'
    ? `${value.toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 })} ${unit}`
    : 'none';

/** The finding fields people read, in the order and rounding the screens use. */
const findingFields: [string, string, (value: unknown, labels: HistoryLabels) => string][] = [
  ['row', 'row', (value, labels) => labels.rowLabel(String(value))],
  ['position', 'position', (value) => String(value)],
  ['zone', 'zone', words],
  ['damage', 'damage', words],
  ['method', 'method', (value) => (value === 'probe' ? 'probe' : 'on the image')],
  ['lengthMm', 'length', (value) => mm(value)],
  ['areaMm2', 'area', (value) => mm(value, 'mm²')],
  ['widthMm', 'width', (value) => mm(value)],
  ['depthMm', 'depth', (value) => mm(value)],
  ['count', 'count', (value) => (value === null || value === undefined ? 'none' : String(value))],
  ['category', 'verdict', (value) => (value ? categoryWords(value as Category) : 'none')],
];

function findingChanges(before: Values, after: Values, labels: HistoryLabels): string[] {
  return findingFields.flatMap(([key, label, show]) => {
    if (!before || !after || !(key in after)) return [];
    const was = show(before[key], labels);
    const now = show(after[key], labels);
    return was === now ? [] : [`${label}: ${was} → ${now}`];
  });
}

function findingPlace(values: Values, labels: HistoryLabels): string {
  if (!values) return '';
  return `${labels.rowLabel(String(values.row))} ${String(values.position)}, ${words(values.zone)}, ${words(values.damage)}`;
}

/** The particulars of an inspection people read, with how the screens name them. */
const particularNames: Record<string, string> = {
  date: 'date',
  reason: 'reason',
  reasonDetail: 'reason in words',
  csn: 'CSN',
  tsn: 'TSN',
  inspectorName: 'inspector',
  qualificationRef: 'qualification',
  qualificationExpiresOn: 'qualification valid until',
  probe: 'probe',
  probeCalibrationDueOn: 'probe calibration due',
};

function particularValue(key: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return 'none';
  if (/^\d{4}-\d{2}-\d{2}$/.test(String(value))) return dayWords(String(value));
  if (key === 'reason') return words(value);
  if (typeof value === 'number') return value.toLocaleString('en-GB');
  return String(value);
}

function particularChanges(before: Values, after: Values): string[] {
  if (!before || !after) return [];
  return Object.entries(particularNames).flatMap(([key, name]) =>
    key in after
      ? [`${name}: ${particularValue(key, before[key])} → ${particularValue(key, after[key])}`]
      : [],
  );
}

function decisionText(value: unknown): string {
  const parsed = decisionSchema.safeParse(value);
  return parsed.success ? decisionWords(parsed.data) : 'a decision';
}

/**
 * One audit entry as a line of a record's history: what happened, in words, with the values that
 * changed rounded as the screens show them. An action without words of its own is named plainly.
 */
export function historyLine(
  entry: { action: string; before: unknown; after: unknown },
  labels: HistoryLabels,
): { summary: string; details: string[] } {
  const before = (entry.before ?? null) as Values;
  const after = (entry.after ?? null) as Values;
  const number = after?.number ?? before?.number;
  switch (entry.action) {
    case 'inspection.created':
      return { summary: 'Opened the inspection', details: [] };
    case 'inspection.flag-acknowledged':
      return {
        summary: `Acknowledged the flag “${words(after?.code)}”`,
        details: after?.note ? [String(after.note)] : [],
      };
    case 'inspection.submitted':
      return { summary: 'Submitted it for review', details: [] };
    case 'inspection.corrected':
      return {
        summary: 'Corrected its particulars (flags computed again, to be acknowledged anew)',
        details: particularChanges(before, after),
      };
    case 'inspection.voided':
      return {
        summary: 'Voided it: it counts for nothing',
        details: after?.reason ? [String(after.reason)] : [],
      };
    case 'inspection.returned-to-draft': {
      const withdrawn = Number(after?.withdrawnDispositions ?? 0);
      return {
        summary: 'Sent it back to draft',
        details: [
          String(after?.reason ?? ''),
          ...(withdrawn
            ? [`Withdrew ${withdrawn} signed disposition${withdrawn === 1 ? '' : 's'}`]
            : []),
        ].filter(Boolean),
      };
    }
    case 'inspection.outcome-signed': {
      const removals = (after?.removals as BeyondAction[] | undefined) ?? [];
      return {
        summary: 'Signed the outcome',
        details: [
          ...(after?.repeatInterval
            ? [`Repeat inspection within ${intervalWords(after.repeatInterval as Interval)}`]
            : []),
          ...removals.map((action) => actionWords(action)),
        ],
      };
    }
    case 'inspection.released':
      return { summary: `Released it (revision ${String(after?.revision ?? 1)})`, details: [] };
    case 'coverage.recorded':
      return {
        summary: `Recorded the coverage of ${labels.rowLabel(String(after?.row))}: ${after?.status === 'full' ? 'fully viewed' : after?.status === 'partial' ? 'partly viewed' : 'not viewed'}`,
        details: after?.reason ? [String(after.reason)] : [],
      };
    case 'image.added':
      return { summary: `Added the image ${String(after?.filename ?? '')}`.trim(), details: [] };
    case 'image.tagged':
      return {
        summary: after?.rowKey
          ? `Tagged an image as ${labels.rowLabel(String(after.rowKey))}${after.position ? ` ${String(after.position)}` : ''}`
          : 'Removed an image’s tag',
        details: [],
      };
    case 'finding.recorded':
      return {
        summary: `Recorded F${String(number)}: ${findingPlace(after, labels)}`,
        details: [
          ...(after?.lengthMm !== null && after?.lengthMm !== undefined
            ? [`length ${mm(after.lengthMm)}`]
            : []),
          ...(after?.areaMm2 !== null && after?.areaMm2 !== undefined
            ? [`area ${mm(after.areaMm2, 'mm²')}`]
            : []),
          ...(after?.category ? [`verdict ${categoryWords(after.category as Category)}`] : []),
        ],
      };
    case 'finding.updated':
      return {
        summary: `Corrected F${String(number)}`,
        details: findingChanges(before, after, labels),
      };
    case 'finding.voided':
      return {
        summary: 'Voided the finding',
        details: after?.reason ? [String(after.reason)] : [],
      };
    case 'disposition.signed':
    case 'disposition.superseded':
      return {
        summary: `${entry.action === 'disposition.signed' ? 'Signed the disposition' : 'Signed a corrected disposition'}: ${decisionText(after?.decision)}`,
        details: after?.concession ? [`Concession ${String(after.concessionRef ?? '')}`] : [],
      };
    case 'limit-set.copied':
      return {
        summary: `Copied as revision ${String(after?.revision ?? '')} with ${String(after?.rules ?? 0)} rules`,
        details: [],
      };
    case 'limit-set.particulars-changed':
      return {
        summary: 'Changed the particulars',
        details: (['revision', 'title', 'manualReference', 'effectiveDate'] as const).flatMap(
          (key) =>
            before && after && key in after && before[key] !== after[key]
              ? [
                  `${words(key.replace(/([A-Z])/g, '-$1').toLowerCase())}: ${String(before[key] ?? 'none')} → ${String(after[key] ?? 'none')}`,
                ]
              : [],
        ),
      };
    case 'limit-set.rules-replaced': {
      const count = (value: Values) => (Array.isArray(value?.rules) ? value.rules.length : 0);
      return {
        summary: 'Changed the rules',
        details: [`${count(before)} rules before, ${count(after)} after`],
      };
    }
    case 'limit-set.published':
      return {
        summary: `Published revision ${String(after?.revision ?? '')}`,
        details: [
          `Drafts judged again: ${String(after?.reevaluatedInspections ?? 0)}`,
          `Content SHA-256 ${String(after?.contentSha256 ?? '').slice(0, 16)}…`,
        ],
      };
    default:
      return { summary: words(entry.action.replace('.', ': ')), details: [] };
  }
}
