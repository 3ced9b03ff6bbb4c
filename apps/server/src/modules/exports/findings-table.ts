import type { Finding } from '@emberline/contracts/findings';
import type { Inspection } from '@emberline/contracts/inspections';
import { inspectionReasonLabels, inspectionStateLabels } from '@emberline/contracts/inspections';
import type { Disposition } from '@emberline/contracts/review';
import { decisionWords } from '@emberline/domain/decision-words';
import { MM_PER_INCH, MM2_PER_SQUARE_INCH } from '@emberline/domain/units';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import type { TableCell } from '../../lib/csv';

/** One exported finding with what it is read beside: its engine, inspection and decision. */
export interface FindingLine {
  engine: {
    serialNumber: string;
    modelId: string;
    modelName: string;
    organisationId: string;
    organisationName: string;
  };
  inspection: Inspection;
  finding: Finding;
  rowLabel: string;
  imageName: string;
  /** The current decision as the caller may see it (as released, for an owner); null if none. */
  disposition: Disposition | null;
}

const round = (value: number | null, places: number): number | null =>
  value === null ? null : Number(value.toFixed(places));
const mm = (value: number | null) => round(value, 4);
const inches = (value: number | null) => round(value === null ? null : value / MM_PER_INCH, 5);
const words = (key: string) => key.replace(/-/g, ' ');

/**
 * The columns of a findings export, in order, each with its header (units in the header) and how
 * a finding fills it: one definition for CSV and XLSX alike.
 */
export const findingColumns: readonly {
  header: string;
  value: (line: FindingLine) => TableCell;
}[] = [
  { header: 'Engine', value: (line) => line.engine.serialNumber },
  { header: 'Model', value: (line) => line.engine.modelName },
  { header: 'Owner', value: (line) => line.engine.organisationName },
  { header: 'Inspection date', value: (line) => line.inspection.date },
  { header: 'Reason', value: (line) => inspectionReasonLabels[line.inspection.reason] },
  { header: 'Inspection state', value: (line) => inspectionStateLabels[line.inspection.state] },
  { header: 'CSN at inspection', value: (line) => line.inspection.csn },
  { header: 'TSN at inspection (h)', value: (line) => line.inspection.tsn },
  { header: 'Finding', value: (line) => `F${line.finding.number}` },
  { header: 'Row', value: (line) => line.rowLabel },
  { header: 'Position', value: (line) => line.finding.position },
  { header: 'Zone', value: (line) => words(line.finding.zone) },
  { header: 'Damage', value: (line) => words(line.finding.damage) },
  { header: 'Measured by', value: (line) => words(line.finding.method) },
  { header: 'Length (mm)', value: (line) => mm(line.finding.lengthMm) },
  { header: 'Length (in)', value: (line) => inches(line.finding.lengthMm) },
  { header: 'Width (mm)', value: (line) => mm(line.finding.widthMm) },
  { header: 'Width (in)', value: (line) => inches(line.finding.widthMm) },
  { header: 'Depth (mm)', value: (line) => mm(line.finding.depthMm) },
  { header: 'Depth (in)', value: (line) => inches(line.finding.depthMm) },
  { header: 'Area (mm²)', value: (line) => mm(line.finding.areaMm2) },
  {
    header: 'Area (in²)',
    value: (line) =>
      round(line.finding.areaMm2 === null ? null : line.finding.areaMm2 / MM2_PER_SQUARE_INCH, 6),
  },
  { header: 'Uncertainty (mm)', value: (line) => mm(line.finding.uncertaintyMm) },
  { header: 'Uncertainty (mm²)', value: (line) => mm(line.finding.uncertaintyMm2) },
  { header: 'Count', value: (line) => line.finding.count },
  {
    header: 'Verdict',
    value: (line) =>
      line.finding.evaluation
        ? verdictStyles[line.finding.evaluation.category].label
        : 'Not judged',
  },
  { header: 'Rule', value: (line) => line.finding.evaluation?.ruleId ?? null },
  { header: 'Limit revision', value: (line) => line.finding.limitSetRevision },
  {
    header: 'Decision',
    value: (line) => (line.disposition ? decisionWords(line.disposition.decision) : null),
  },
  {
    header: 'Concession',
    value: (line) => (line.disposition ? (line.disposition.concession ? 'yes' : 'no') : null),
  },
  { header: 'Concession reference', value: (line) => line.disposition?.concessionRef ?? null },
  { header: 'Signed by', value: (line) => line.disposition?.signature.signerName ?? null },
  {
    header: 'Signed at (UTC)',
    value: (line) => line.disposition?.signature.signedAt ?? null,
  },
  { header: 'Image', value: (line) => line.imageName },
  { header: 'Notes', value: (line) => line.finding.notes || null },
];

export const findingHeader = findingColumns.map((column) => column.header);
export const findingCells = (line: FindingLine): TableCell[] =>
  findingColumns.map((column) => column.value(line));
