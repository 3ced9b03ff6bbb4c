import {
  coverageInputSchema,
  findingInputSchema,
  type CoverageInput,
  type FindingInput,
} from '@emberline/contracts/findings';
import { addDays } from '@emberline/domain/dates';
import { inspectionFlags } from '@emberline/domain/inspection-flags';
import type { AppContext, RequestMeta } from '../context';
import { inTransaction } from '../db/client';
import type { Principal } from '../http/principal';
import { processImage, rasteriseSvg, type ProcessedImage } from '../lib/images/image-pipeline';
import { appendAudit } from '../modules/audit/audit.repository';
import { createCoverageService } from '../modules/coverage/coverage.service';
import { createFindingsService } from '../modules/findings/findings.service';
import { createInspectionsService } from '../modules/inspections/inspections.service';
import { createReviewService } from '../modules/review/review.service';
import { defaultDecision } from '@emberline/domain/decisions';
import { dispositionInputSchema, outcomeInputSchema } from '@emberline/contracts/review';
import { insertImage } from '../modules/images/images.repository';
import { insertInspection } from '../modules/inspections/inspections.repository';
import {
  borescopeScene,
  crackPoints,
  demoReference,
  ellipseOutline,
  randomMarks,
  type DemoMark,
} from './demo-images';
import { demoUsers } from './demo-scenario';

// The demo's inspection history, all invented: VT3-D0103 seen three times while a blade crack
// grows towards its (invented) limit, and VT3-D0201 submitted and waiting for an engineer.
// Findings go through the findings service, so that they are measured and judged as any other.

export const DEMO_INSPECTION_ID = 'inspection-d0103-demo';

type Point = [number, number];

interface DemoStill {
  name: string;
  row: string;
  position: number;
  seed: number;
  marks: DemoMark[];
}

interface DemoFinding {
  /** Names the finding within the history, so that a later one can continue it. */
  key: string;
  still: number;
  row: string;
  position: number;
  zone: string;
  damage: FindingInput['damage'];
  shape: FindingInput['shape'];
  continues?: string;
  depthMm?: number;
  uncertaintyMm?: number;
  notes?: string;
}

interface DemoInspection {
  id: string;
  engineId: string;
  daysAgo: number;
  csn: number;
  tsn: number;
  reason: 'scheduled' | 'repeat-inspection' | 'over-temperature';
  reasonDetail: string;
  rows: string[];
  state: 'draft' | 'submitted' | 'released';
  /** A probe whose calibration ran out this many days before the inspection, acknowledged thus. */
  lapsedCalibration?: { daysBefore: number; acknowledgement: string };
  stills: DemoStill[];
  findings: DemoFinding[];
  coverage: Record<string, CoverageInput>;
}

// The growing crack on HPT blade 12, leading edge: 0.80, 1.30 and 1.34 mm at 0.01 mm a pixel
// (the invented limits: serviceable to 0.5 mm, repeat inspection to 1.5 mm every 200 cycles).
const crackStart: Point = [760, 420];
const bladeCrack = (lengthPx: number) => crackPoints(crackStart, lengthPx, 4, 12);
const burnPatch = (centre: Point, rx: number, ry: number): DemoMark => ({
  kind: 'burn',
  centre,
  rx,
  ry,
});
const coatingPatch = (centre: Point, rx: number, ry: number): DemoMark => ({
  kind: 'coating-loss',
  outline: ellipseOutline(centre, rx, ry, 12),
});
const outline = (mark: DemoMark): Point[] =>
  mark.kind === 'burn'
    ? ellipseOutline(mark.centre, mark.rx, mark.ry)
    : mark.kind === 'coating-loss'
      ? mark.outline
      : mark.points;

const coatingFirst = coatingPatch([560, 640], 230, 200);
const coatingSecond = coatingPatch([560, 640], 270, 250);
const burnSmall = burnPatch([900, 500], 120, 105);
const burnLarge = burnPatch([820, 560], 220, 175);
const full: CoverageInput = { status: 'full' };

const history: DemoInspection[] = [
  {
    id: 'inspection-d0103-h1',
    engineId: 'engine-d0103',
    daysAgo: 70,
    csn: 9_028,
    tsn: 12_640,
    reason: 'scheduled',
    reasonDetail: 'Invented demo: scheduled hot-section look',
    rows: ['hpt1-ngv', 'hpt1-blade'],
    state: 'released',
    stills: [
      {
        name: 'h1-hpt1-blade-pos12.jpg',
        row: 'hpt1-blade',
        position: 12,
        seed: 301,
        marks: [{ kind: 'crack', points: bladeCrack(80) }],
      },
      {
        name: 'h1-hpt1-ngv-pos05.jpg',
        row: 'hpt1-ngv',
        position: 5,
        seed: 302,
        marks: [coatingFirst],
      },
    ],
    findings: [
      {
        key: 'blade12-crack',
        still: 0,
        row: 'hpt1-blade',
        position: 12,
        zone: 'leading-edge',
        damage: 'crack',
        shape: { kind: 'polyline', points: bladeCrack(80) },
      },
      {
        key: 'ngv5-coating',
        still: 1,
        row: 'hpt1-ngv',
        position: 5,
        zone: 'pressure-side',
        damage: 'coating-loss',
        shape: { kind: 'polygon', points: outline(coatingFirst) },
      },
    ],
    coverage: { 'hpt1-ngv': full, 'hpt1-blade': full },
  },
  {
    id: 'inspection-d0103-h2',
    engineId: 'engine-d0103',
    daysAgo: 35,
    csn: 9_242,
    tsn: 12_939,
    reason: 'repeat-inspection',
    reasonDetail: 'Invented demo: repeat inspection of the blade 12 crack',
    rows: ['hpt1-ngv', 'hpt1-blade'],
    state: 'released',
    stills: [
      {
        name: 'h2-hpt1-blade-pos12.jpg',
        row: 'hpt1-blade',
        position: 12,
        seed: 311,
        marks: [{ kind: 'crack', points: bladeCrack(130) }],
      },
      {
        name: 'h2-hpt1-ngv-pos05.jpg',
        row: 'hpt1-ngv',
        position: 5,
        seed: 312,
        marks: [coatingSecond],
      },
    ],
    findings: [
      {
        key: 'blade12-crack-2',
        continues: 'blade12-crack',
        still: 0,
        row: 'hpt1-blade',
        position: 12,
        zone: 'leading-edge',
        damage: 'crack',
        shape: { kind: 'polyline', points: bladeCrack(130) },
      },
      {
        key: 'ngv5-coating-2',
        continues: 'ngv5-coating',
        still: 1,
        row: 'hpt1-ngv',
        position: 5,
        zone: 'pressure-side',
        damage: 'coating-loss',
        shape: { kind: 'polygon', points: outline(coatingSecond) },
      },
    ],
    coverage: { 'hpt1-ngv': full, 'hpt1-blade': full },
  },
  {
    id: DEMO_INSPECTION_ID,
    engineId: 'engine-d0103',
    daysAgo: 3,
    csn: 9_440,
    tsn: 13_215,
    reason: 'scheduled',
    reasonDetail: 'Invented demo: routine hot-section look',
    rows: ['hpt1-ngv', 'hpt1-blade'],
    state: 'draft',
    stills: [
      { name: 'hpt1-ngv-pos04.jpg', row: 'hpt1-ngv', position: 4, seed: 101, marks: [burnLarge] },
      {
        name: 'hpt1-ngv-pos05.jpg',
        row: 'hpt1-ngv',
        position: 5,
        seed: 108,
        marks: randomMarks(108, ['coating-loss']),
      },
      { name: 'hpt1-ngv-pos17.jpg', row: 'hpt1-ngv', position: 17, seed: 115, marks: [] },
      {
        name: 'hpt1-blade-pos12.jpg',
        row: 'hpt1-blade',
        position: 12,
        seed: 122,
        marks: [{ kind: 'crack', points: bladeCrack(134) }],
      },
      {
        name: 'hpt1-blade-pos13.jpg',
        row: 'hpt1-blade',
        position: 13,
        seed: 129,
        marks: randomMarks(129, ['coating-loss', 'crack']),
      },
      { name: 'hpt1-blade-pos40.jpg', row: 'hpt1-blade', position: 40, seed: 136, marks: [] },
    ],
    findings: [
      {
        key: 'blade12-crack-3',
        continues: 'blade12-crack-2',
        still: 3,
        row: 'hpt1-blade',
        position: 12,
        zone: 'leading-edge',
        damage: 'crack',
        shape: { kind: 'polyline', points: bladeCrack(134) },
        notes: 'Growing: compare with the two earlier inspections.',
      },
    ],
    coverage: {
      'hpt1-ngv': {
        status: 'partial',
        viewedPositions: Array.from({ length: 20 }, (_, index) => index + 1),
      },
    },
  },
  {
    id: 'inspection-d0201-demo',
    engineId: 'engine-d0201',
    daysAgo: 10,
    csn: 7_084,
    tsn: 14_876,
    reason: 'over-temperature',
    reasonDetail: 'Invented demo: EGT exceedance reported by the crew',
    rows: ['hpt1-ngv', 'hpt1-blade', 'lpt1-ngv'],
    state: 'submitted',
    lapsedCalibration: {
      daysBefore: 6,
      acknowledgement: 'Spare probe DEMO-121 not on site; calibration renewal booked (invented)',
    },
    stills: [
      { name: 'hpt1-ngv-pos09.jpg', row: 'hpt1-ngv', position: 9, seed: 401, marks: [burnSmall] },
      { name: 'hpt1-ngv-pos10.jpg', row: 'hpt1-ngv', position: 10, seed: 402, marks: [burnLarge] },
      {
        name: 'hpt1-ngv-pos15.jpg',
        row: 'hpt1-ngv',
        position: 15,
        seed: 403,
        marks: [
          {
            kind: 'erosion',
            points: [
              [700, 300],
              [760, 520],
              [790, 700],
            ],
          },
        ],
      },
      {
        name: 'hpt1-blade-pos22.jpg',
        row: 'hpt1-blade',
        position: 22,
        seed: 404,
        marks: [{ kind: 'crack', points: crackPoints([640, 860], 40, 2, 22) }],
      },
      {
        name: 'hpt1-blade-pos30.jpg',
        row: 'hpt1-blade',
        position: 30,
        seed: 405,
        marks: [{ kind: 'crack', points: crackPoints([980, 260], 75, 3, 30) }],
      },
    ],
    findings: [
      {
        key: 'd0201-ngv9-burn',
        still: 0,
        row: 'hpt1-ngv',
        position: 9,
        zone: 'leading-edge',
        damage: 'burn',
        shape: { kind: 'polygon', points: outline(burnSmall) },
      },
      {
        key: 'd0201-ngv10-burn',
        still: 1,
        row: 'hpt1-ngv',
        position: 10,
        zone: 'leading-edge',
        damage: 'burn',
        shape: { kind: 'polygon', points: outline(burnLarge) },
      },
      {
        key: 'd0201-ngv15-erosion',
        still: 2,
        row: 'hpt1-ngv',
        position: 15,
        zone: 'leading-edge',
        damage: 'erosion',
        shape: {
          kind: 'polyline',
          points: [
            [700, 300],
            [760, 520],
            [790, 700],
          ],
        },
        notes: 'Erosion of the leading edge; the limit set has no erosion limit for this row.',
      },
      {
        key: 'd0201-blade22-root',
        still: 3,
        row: 'hpt1-blade',
        position: 22,
        zone: 'root-fillet',
        damage: 'crack',
        shape: { kind: 'polyline', points: crackPoints([640, 860], 40, 2, 22) },
      },
      {
        key: 'd0201-blade30-tip',
        still: 4,
        row: 'hpt1-blade',
        position: 30,
        zone: 'tip',
        damage: 'crack',
        shape: { kind: 'polyline', points: crackPoints([980, 260], 75, 3, 30) },
        notes: 'Close to the tip-crack limit: a sharper view could settle it.',
      },
    ],
    coverage: {
      'hpt1-ngv': full,
      'hpt1-blade': full,
      'lpt1-ngv': {
        status: 'none',
        reason: 'Port BP-4 plug seized; to be freed at the next shop visit',
      },
    },
  },
];

interface PreparedStill {
  still: DemoStill;
  processed: ProcessedImage;
  sha256: string;
  bytes: number;
  file: string;
}

async function prepareStill(ctx: AppContext, still: DemoStill): Promise<PreparedStill> {
  const jpeg = await rasteriseSvg(borescopeScene(still.seed, still.marks));
  const file = await ctx.storage.writeTemp(jpeg);
  return {
    still,
    processed: await processImage(file),
    sha256: await ctx.storage.hash(file),
    bytes: jpeg.length,
    file,
  };
}

const loader: RequestMeta = { requestId: 'demo-history', ip: '127.0.0.1', userAgent: null };

function demoPrincipal(id: string): Principal {
  const user = demoUsers.find((candidate) => candidate.id === id)!;
  return {
    user: { ...user, organisationName: 'Ashgrove Hot Section Services (demo)' },
    sessionId: 'demo-history',
  };
}

/**
 * Loads the demo inspections with their invented stills, findings and coverage. Runs after the
 * demo scenario, outside its transaction, because the stills are rendered and processed first.
 */
export async function loadDemoHistory(ctx: AppContext): Promise<void> {
  const today = ctx.now().toISOString().slice(0, 10);
  const inspector = demoPrincipal('user-inspector');
  const signer = demoPrincipal('user-engineer2');
  const findings = createFindingsService(ctx);
  const coverage = createCoverageService(ctx);
  const inspections = createInspectionsService(ctx);
  // The demo loader is trusted code that signs for an invented engineer: no password to ask.
  const review = createReviewService(ctx, { confirmPassword: async () => {} });
  const recorded = new Map<string, string>();

  // Every still is rendered and processed first, a few at a time: rendering dominates the load.
  const stills = history.flatMap((spec) => spec.stills);
  const ready = new Map<DemoStill, PreparedStill>();
  let next = 0;
  await Promise.all(
    Array.from({ length: 3 }, async () => {
      while (next < stills.length) {
        const still = stills[next++]!;
        ready.set(still, await prepareStill(ctx, still));
      }
    }),
  );

  for (const spec of history) {
    const prepared = spec.stills.map((still) => ready.get(still)!);
    for (const item of prepared) await ctx.storage.commitOriginal(item.file, item.sha256);
    const date = addDays(today, -spec.daysAgo);
    const probeCalibrationDueOn = spec.lapsedCalibration
      ? addDays(date, -spec.lapsedCalibration.daysBefore)
      : addDays(today, 120);
    const now = ctx.now();
    const imageIds = prepared.map((_, index) => `${spec.id}-image-${index + 1}`);
    inTransaction(ctx.db, (tx) => {
      insertInspection(tx, {
        id: spec.id,
        engineId: spec.engineId,
        date,
        reason: spec.reason,
        reasonDetail: spec.reasonDetail,
        csn: spec.csn,
        tsn: spec.tsn,
        inspectorName: 'Tobias Rennick',
        qualificationRef: 'DEMO-BSI-L2-0457',
        qualificationExpiresOn: addDays(today, 300),
        probe: 'Demo probe VX-6, s/n DEMO-118',
        probeCalibrationDueOn,
        rows: spec.rows,
        state: 'draft',
        flags: inspectionFlags(
          {
            date,
            csn: spec.csn,
            tsn: spec.tsn,
            qualificationExpiresOn: addDays(today, 300),
            probeCalibrationDueOn,
          },
          { csn: spec.csn, tsn: spec.tsn, tsnCsnAsOf: date },
          [],
        ).map((flag) => ({ ...flag, acknowledgedAt: null, acknowledgedBy: null, note: null })),
        createdBy: 'user-inspector',
        createdAt: new Date(now.getTime() - spec.daysAgo * 86_400_000),
      });
      prepared.forEach(({ still, processed, sha256, bytes }, index) => {
        insertImage(tx, {
          id: imageIds[index]!,
          inspectionId: spec.id,
          sha256,
          format: processed.format,
          bytes,
          width: processed.width,
          height: processed.height,
          originalName: still.name,
          capturedAt: null,
          source: 'upload',
          videoFileName: null,
          videoTimeSeconds: null,
          rowKey: still.row,
          position: still.position,
          thumbnail: processed.thumbnail,
          thumbnailType: processed.thumbnailType,
          preview: processed.preview,
          previewType: processed.previewType,
          createdBy: 'user-inspector',
          createdAt: new Date(now.getTime() + index),
        });
      });
    });

    for (const item of spec.findings) {
      const finding = findings.record(
        inspector,
        spec.id,
        findingInputSchema.parse({
          imageId: imageIds[item.still]!,
          shape: item.shape,
          calibration: demoReference,
          row: item.row,
          position: item.position,
          zone: item.zone,
          damage: item.damage,
          method: 'image',
          depthMm: item.depthMm ?? null,
          notes: item.notes ?? '',
          previousFindingId: item.continues ? recorded.get(item.continues)! : null,
        } satisfies FindingInput),
        loader,
      );
      recorded.set(item.key, finding.id);
    }
    for (const [row, rowCoverage] of Object.entries(spec.coverage))
      coverage.record(inspector, spec.id, row, coverageInputSchema.parse(rowCoverage), loader);

    // Submitted, dispositioned and released through the same services as a person would: the
    // signatures and the audit rows they leave verify like any other. Recorded by the inspector,
    // signed by another person (DESIGN §5.5, separation of duties).
    if (spec.lapsedCalibration)
      inspections.acknowledge(
        inspector,
        spec.id,
        'probe-calibration-expired',
        spec.lapsedCalibration.acknowledgement,
        loader,
      );
    if (spec.state !== 'draft') inspections.submit(inspector, spec.id, loader);
    if (spec.state === 'released') {
      for (const finding of findings.list(inspector, spec.id).items) {
        if (finding.status !== 'recorded') continue;
        const decision = finding.evaluation && defaultDecision(finding.evaluation);
        await review.dispose(
          signer,
          finding.id,
          dispositionInputSchema.parse({
            decision: decision ?? { kind: 'serviceable' },
            rationale: decision
              ? 'As the verdict calls for under the invented demo limits.'
              : 'Reviewed on the image: no limit applies (invented demo decision).',
            concessionRef: decision ? null : 'DEMO-CONCESSION-001 (invented)',
            password: 'not asked of the demo loader',
          }),
          loader,
        );
      }
      await review.outcome(
        signer,
        spec.id,
        outcomeInputSchema.parse({ password: 'not asked of the demo loader' }),
        loader,
      );
      await review.release(signer, spec.id, 'not asked of the demo loader', loader);
    }
  }
  inTransaction(ctx.db, (tx) => {
    appendAudit(tx, ctx.now(), {
      actorUserId: null,
      action: 'demo.history-loaded',
      entityType: 'scenario',
      entityId: 'demo',
      after: { inspections: history.length, findings: recorded.size },
    });
  });
}
