import { coverageStatusLabels } from '@emberline/contracts/findings';
import type { Category } from '@emberline/contracts/limits';
import { inspectionReasonLabels } from '@emberline/contracts/inspections';
import type { InspectionReview } from '@emberline/contracts/review';
import { countWords, dayWords } from '@emberline/domain/dates';
import { decisionWords, intervalWords, actionWords } from '@emberline/domain/decision-words';
import { MM_PER_INCH, MM2_PER_SQUARE_INCH } from '@emberline/domain/units';
import { annotationOverlay, type OverlayShape } from '@emberline/drawings/overlay';
import { clockOfPositionOne, stageRing } from '@emberline/drawings/stage-ring';
import { renderSvg } from '@emberline/drawings/svg';
import { trendChart } from '@emberline/drawings/trend-chart';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import type { Rule } from '@emberline/contracts/limits';
import { seriesAgainstRule, trend } from '@emberline/domain/trend';
import type { AppContext } from '../../context';
import { drawOverJpeg, svgToPng } from '../../lib/images/image-pipeline';
import { renderPdf } from '../../lib/pdf/pdf-renderer';
import { listCoverage } from '../coverage/coverage.repository';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRow } from '../engines/engines.repository';
import { listFindings } from '../findings/findings.repository';
import { listImages, readRendition } from '../images/images.repository';
import { findInspection } from '../inspections/inspections.repository';
import { findLimitSet, listRules } from '../limit-sets/limit-sets.repository';
import { lastSignature } from '../records/records.repository';
import { groupBy } from '../planning/due-basis';
import { seriesPoints } from '../planning/planning.repository';
import { reportDocument, type ReportContent } from './report-document';

const words = (key: string) => key.replace(/-/g, ' ');
/** A hash in groups of sixteen, so that it wraps in a table cell and reads aloud. */
const grouped = (hash: string) => hash.match(/.{1,16}/g)!.join(' ');
const at = (iso: string) => `${dayWords(iso)} ${iso.slice(11, 16)}`;

export interface ReportRequest {
  inspectionId: string;
  review: InspectionReview;
  revision: number;
  verificationCode: string;
  verifyUrl: string;
  /** The next inspection due, in words, as the engine's due status gives it now. */
  nextDue: string;
}

/**
 * Renders the report of an inspection whose outcome is signed (DESIGN §3): everything is read
 * here and put in words; `reportDocument` lays it out and `renderPdf` makes the bytes. Nothing is
 * written: the caller stores the bytes and signs their hash.
 */
export async function buildReport(
  ctx: AppContext,
  request: ReportRequest,
  /** `images: false` leaves the annotated images out: the benchmark's ceiling, never a report. */
  options: { images?: boolean } = {},
): Promise<Buffer> {
  const { db } = ctx;
  const inspection = findInspection(db, request.inspectionId)!;
  const engine = findEngineRow(db, inspection.engineId)!;
  const rows = listModelRows(db, inspection.modelId).filter((row) =>
    inspection.rows.includes(row.key),
  );
  const label = (key: string) => rows.find((row) => row.key === key)?.label ?? words(key);
  const coverage = listCoverage(db, inspection.id);
  const findings = listFindings(db, inspection.id)
    .filter((finding) => finding.status === 'recorded')
    .sort((a, b) => a.number - b.number);
  const current = new Map(
    request.review.items.filter((item) => item.current).map((item) => [item.findingId, item]),
  );
  const outcome = request.review.outcomes.find((item) => item.current)!;
  const limitSet = inspection.limitSetId ? findLimitSet(db, inspection.limitSetId) : undefined;
  const verdictOf = (finding: (typeof findings)[number]) =>
    (finding.category as Category | null) ?? null;

  const rings = await Promise.all(
    rows.map(async (row) => {
      const verdicts = new Map<number, Category>();
      const order: Category[] = ['serviceable', 'repeat-inspection', 'review', 'beyond-limits'];
      for (const finding of findings.filter((item) => item.rowKey === row.key)) {
        const verdict = verdictOf(finding);
        const before = verdicts.get(finding.position);
        if (verdict && (!before || order.indexOf(verdict) > order.indexOf(before)))
          verdicts.set(finding.position, verdict);
      }
      const viewed = coverage.find((item) => item.rowKey === row.key);
      const unviewed =
        viewed?.status === 'full'
          ? new Set<number>()
          : new Set(
              Array.from({ length: row.count }, (_, index) => index + 1).filter(
                (position) => !(viewed?.viewedPositions ?? []).includes(position),
              ),
            );
      const svg = renderSvg(
        stageRing({
          count: row.count,
          positionOneClock: clockOfPositionOne(row.numbering.positionOne),
          direction: row.numbering.direction,
          viewpoint: words(row.numbering.viewpoint),
          title: row.label,
          verdicts,
          unviewed,
          size: 480,
        }),
      );
      return { row: row.label, png: await svgToPng(svg, 480) };
    }),
  );

  // Each image with findings, drawn over with the same overlay the screen shows.
  const imageMeta = new Map(listImages(db, inspection.id).map((image) => [image.id, image]));
  const byImage = new Map<string, typeof findings>();
  for (const finding of findings)
    byImage.set(finding.imageId, [...(byImage.get(finding.imageId) ?? []), finding]);
  // Drawn side by side (sharp works off the event loop), kept in the order of the findings.
  const drawnImages = await Promise.all(
    [...(options.images === false ? [] : byImage)].map(async ([imageId, onImage]) => {
      const meta = imageMeta.get(imageId);
      const preview = readRendition(db, imageId, 'preview');
      if (!meta || !preview) return null;
      const shapes: OverlayShape[] = onImage.map((finding) => ({
        id: finding.id,
        label: `F${finding.number}`,
        kind: finding.shape.kind,
        points: finding.shape.points,
        category: verdictOf(finding),
      }));
      const overlay = renderSvg(
        annotationOverlay({ width: meta.width, height: meta.height, shapes }),
      );
      const drawn = await drawOverJpeg(preview.data, overlay, meta.width, meta.height);
      return {
        ...drawn,
        caption: `${meta.originalName ?? 'Image'}: ${onImage.map((finding) => `F${finding.number}`).join(', ')} (${label(onImage[0]!.rowKey)})`,
      };
    }),
  );
  const images: ReportContent['images'] = drawnImages.filter((image) => image !== null);

  const measurement = (finding: (typeof findings)[number]) => {
    if (finding.lengthMm !== null)
      return `${finding.lengthMm.toFixed(2)} ± ${(finding.uncertaintyMm ?? 0).toFixed(2)} mm\n${(finding.lengthMm / MM_PER_INCH).toFixed(3)} ± ${((finding.uncertaintyMm ?? 0) / MM_PER_INCH).toFixed(3)} in`;
    if (finding.areaMm2 !== null)
      return `${finding.areaMm2.toFixed(2)} ± ${(finding.uncertaintyMm2 ?? 0).toFixed(2)} mm²\n${(finding.areaMm2 / MM2_PER_SQUARE_INCH).toFixed(4)} in²`;
    if (finding.count !== null) return `count ${finding.count}`;
    return '—';
  };

  // The damage trend of each series with three measurements or more, up to this inspection
  // (drafts of others aside), against the outer limit of the rule that judged this finding.
  const series = groupBy(
    seriesPoints(db, [...new Set(findings.map((finding) => finding.seriesId))]),
    (point) => point.seriesId,
  );
  const rulesOf = new Map<string, Map<string, Rule>>();
  const trends: ReportContent['trends'] = [];
  for (const finding of findings) {
    const ruleId = (finding.evaluation as { ruleId?: string | null } | null)?.ruleId;
    if (!finding.limitSetId || !ruleId) continue;
    if (!rulesOf.has(finding.limitSetId))
      rulesOf.set(
        finding.limitSetId,
        new Map(listRules(db, finding.limitSetId).map((rule) => [rule.id, rule])),
      );
    const rule = rulesOf.get(finding.limitSetId)!.get(ruleId);
    const points = (series.get(finding.seriesId) ?? []).filter(
      (point) =>
        point.csn <= inspection.csn &&
        (point.inspectionState !== 'draft' || point.inspectionId === inspection.id),
    );
    const against = rule && seriesAgainstRule(rule, points);
    if (!against || against.points.length < 3) continue;
    const unit = against.area ? 'mm²' : 'mm';
    const dateAt = new Map(points.map((point) => [point.csn, point.date]));
    const distinct = new Set(against.points.map((point) => point.csn)).size >= 2;
    const fit = distinct
      ? trend({
          points: against.points.map((point) => ({ csn: point.csn, value: point.value })),
          limit: against.limit,
        })
      : null;
    const caption = `F${finding.number}, ${label(finding.rowKey)} ${finding.position}, ${words(finding.damage)} in the ${words(finding.zone)}: ${against.points.length} measurements`;
    const svg = renderSvg(
      trendChart({ title: caption, points: against.points, limit: against.limit, fit, unit }),
    );
    trends.push({
      caption,
      chart: { png: await svgToPng(svg, 960), width: 480 },
      lines: [
        ...against.points.map(
          (measured) =>
            `CSN ${countWords(measured.csn)} (${dayWords(dateAt.get(measured.csn)!)}): ${measured.value.toFixed(2)} ± ${measured.uncertainty.toFixed(2)} ${unit}`,
        ),
        fit
          ? `Straight line: ${fit.slopePerCycle >= 0 ? '+' : ''}${(fit.slopePerCycle * 1000).toFixed(3)} ${unit} per 1,000 cycles${fit.r2 !== null ? ` (r² ${fit.r2.toFixed(2)})` : ''}; ${fit.projectedCsnAtLimit !== null && fit.cyclesRemaining !== null ? `it reaches the limit of ${against.limit.toFixed(2)} ${unit} at about CSN ${countWords(Math.round(fit.projectedCsnAtLimit))}, ${countWords(Math.round(fit.cyclesRemaining))} cycles after the last measurement.` : `it does not grow towards the limit of ${against.limit.toFixed(2)} ${unit}.`}`
          : 'Measured at one CSN only: no line is drawn.',
      ],
    });
  }

  const chain = lastSignature(db);
  const content: ReportContent = {
    revision: request.revision,
    replacesRevision: request.revision > 1 ? request.revision - 1 : null,
    verificationCode: request.verificationCode,
    verifyUrl: request.verifyUrl,
    issuedOn: dayWords(ctx.now().toISOString()),
    engine: {
      rows: [
        ['Serial number', engine.serialNumber],
        ['Model', engine.modelName],
        ['Owner', engine.organisationName],
        [
          'Aircraft and position',
          `${engine.registration ?? 'not installed'}${engine.installedPosition ? `, position ${engine.installedPosition}` : ''}`,
        ],
        [
          'TSN / CSN at inspection',
          `${countWords(inspection.tsn)} h / ${countWords(inspection.csn)}`,
        ],
      ],
    },
    inspection: {
      rows: [
        ['Date', dayWords(inspection.date)],
        [
          'Reason',
          `${inspectionReasonLabels[inspection.reason]}${inspection.reasonDetail ? `: ${inspection.reasonDetail}` : ''}`,
        ],
        [
          'Inspector',
          `${inspection.inspectorName} (qualification ${inspection.qualificationRef}, valid to ${dayWords(inspection.qualificationExpiresOn)})`,
        ],
        [
          'Probe',
          `${inspection.probe} (calibration due ${dayWords(inspection.probeCalibrationDueOn)})`,
        ],
        ['Rows inspected', rows.map((row) => row.label).join(', ')],
      ],
    },
    outcome: {
      decision:
        outcome.kind === 'serviceable'
          ? 'Serviceable'
          : outcome.kind === 'repeat-inspection'
            ? `Serviceable with a repeat inspection within ${intervalWords(outcome.repeatInterval)}`
            : 'Remove from service',
      lines: [
        ...outcome.removals.map((action) => actionWords(action)),
        ...outcome.flagAcceptances.map((flag) => `Flag accepted: ${flag.note}`),
      ],
      signedBy: `${outcome.signature.signerName}${outcome.signature.authorisationRef ? ` (authorisation ${outcome.signature.authorisationRef})` : ''}, ${at(outcome.signature.signedAt)} UTC`,
    },
    nextDue: request.nextDue,
    limitSet: limitSet
      ? `${limitSet.title}, revision ${limitSet.revision}${limitSet.invented ? ' (invented demo limits: never for use on an engine)' : ''}${limitSet.manualReference ? `, ${limitSet.manualReference}` : ''}`
      : 'none recorded',
    coverage: rows.map((row) => {
      const item = coverage.find((entry) => entry.rowKey === row.key);
      return {
        row: row.label,
        status: item ? coverageStatusLabels[item.status] : 'Not recorded',
        viewed:
          item?.status === 'partial'
            ? `positions ${item.viewedPositions.join(', ')} of ${row.count}`
            : item?.status === 'full'
              ? `all ${row.count}`
              : '—',
        note: [item?.noDamageFound ? 'no damage found' : '', item?.reason ?? '']
          .filter(Boolean)
          .join('; '),
      };
    }),
    rings,
    findings: findings.map((finding) => {
      const disposition = current.get(finding.id);
      const verdict = verdictOf(finding);
      return {
        number: `F${finding.number}`,
        row: label(finding.rowKey),
        position: String(finding.position),
        zone: words(finding.zone),
        damage: words(finding.damage),
        measurement: measurement(finding),
        verdict: verdict ? verdictStyles[verdict].label : 'Not judged',
        decision: disposition ? decisionWords(disposition.decision) : '—',
        concession: disposition?.concession
          ? `yes${disposition.concessionRef ? `, ${disposition.concessionRef}` : ''}`
          : 'no',
        signer: disposition?.signature.signerName ?? '—',
      };
    }),
    images,
    trends,
    signatures: [
      ...request.review.items.filter((item) => item.current).map((item) => item.signature),
      outcome.signature,
    ].map((signature) => ({
      kind: words(signature.kind),
      signer: `${signature.signerName}${signature.authorisationRef ? ` (${signature.authorisationRef})` : ''}`,
      signedAt: at(signature.signedAt),
      sha256: grouped(signature.sha256),
    })),
    chainHead: chain ? grouped(chain.sha256) : 'none',
  };
  return renderPdf(reportDocument(content));
}
