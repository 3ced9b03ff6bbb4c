import type { Finding } from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import type { EvaluationFinding, FindingEvaluation, Rule } from '@emberline/contracts/limits';
import type { Calibration, MeasurementResult, Shape } from '@emberline/contracts/measurement';
import { DomainError } from '@emberline/domain/errors';
import { evaluate } from '@emberline/domain/limits';
import { measure } from '@emberline/domain/measurement';

export type Outcome<T> = { value: T; error: null } | { value: null; error: string };

const attempt = <T>(work: () => T): Outcome<T> => {
  try {
    return { value: work(), error: null };
  } catch (error) {
    if (error instanceof DomainError) return { value: null, error: error.message };
    throw error;
  }
};

/** The measurement of the shape being drawn, by the same code the server runs. */
export function liveMeasurement(
  calibration: Calibration | null,
  shape: Shape | null,
  pickUncertaintyPx: number,
): Outcome<MeasurementResult> | null {
  if (!calibration || !shape || shape.kind === 'point') return null;
  return attempt(() => measure(calibration, shape, pickUncertaintyPx));
}

export const toEvaluationFinding = (finding: Finding): EvaluationFinding => ({
  id: finding.id,
  row: finding.row,
  position: finding.position,
  zone: finding.zone,
  damage: finding.damage,
  lengthMm: finding.lengthMm,
  widthMm: finding.widthMm,
  depthMm: finding.depthMm,
  areaMm2: finding.areaMm2,
  count: finding.count,
  uncertaintyMm: finding.uncertaintyMm,
  uncertaintyMm2: finding.uncertaintyMm2,
});

/**
 * The verdict the new finding would get: the whole inspection judged with it, as the server will
 * judge it when it is recorded (a count or adjacency limit may turn on its neighbours).
 */
export function liveVerdict(
  rows: readonly EngineModelRow[],
  rules: readonly Rule[],
  recorded: readonly Finding[],
  draft: EvaluationFinding,
): Outcome<FindingEvaluation> {
  // Only the rows of this inspection are given: rules of other rows cannot touch its findings.
  const keys = new Set(rows.map((row) => row.key));
  return attempt(() => {
    const result = evaluate({
      rows: Object.fromEntries(rows.map((row) => [row.key, { count: row.count }])),
      rules: rules.filter((rule) => keys.has(rule.row)),
      findings: [
        ...recorded.filter((finding) => finding.status === 'recorded').map(toEvaluationFinding),
        draft,
      ],
    });
    return result.findings.at(-1)!;
  });
}

/** Positions typed as "1-20, 25, 31-33". */
export function parsePositions(text: string, count: number): Outcome<number[]> {
  const positions = new Set<number>();
  for (const part of text.split(/[,\s]+/).filter(Boolean)) {
    const match = /^(\d+)(?:\s*[-–]\s*(\d+))?$/.exec(part);
    if (!match)
      return { value: null, error: `“${part}” is not a position or a range such as 1-20` };
    const from = Number(match[1]);
    const to = Number(match[2] ?? match[1]);
    if (from < 1 || to > count || from > to)
      return { value: null, error: `${part} is outside positions 1 to ${count}` };
    for (let position = from; position <= to; position += 1) positions.add(position);
  }
  return { value: [...positions].sort((a, b) => a - b), error: null };
}

/** Positions written back as ranges: [1,2,3,5] → "1-3, 5". */
export function formatPositions(positions: readonly number[]): string {
  const parts: string[] = [];
  let start: number | null = null;
  positions.forEach((position, index) => {
    if (start === null) start = position;
    const next = positions[index + 1];
    if (next !== position + 1) {
      parts.push(start === position ? String(position) : `${start}-${position}`);
      start = null;
    }
  });
  return parts.join(', ');
}
