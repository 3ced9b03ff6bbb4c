import { addDays } from '@emberline/domain/dates';
import type { AppContext } from '../context';
import { inTransaction } from '../db/client';
import { processImage, rasteriseSvg, type ProcessedImage } from '../lib/images/image-pipeline';
import { appendAudit } from '../modules/audit/audit.repository';
import { insertImage } from '../modules/images/images.repository';
import { insertInspection } from '../modules/inspections/inspections.repository';
import { borescopeScene, type DemoMark } from './demo-images';

export const DEMO_INSPECTION_ID = 'inspection-d0103-demo';

const stills: { name: string; marks: DemoMark[]; row: string; position: number }[] = [
  { name: 'hpt1-ngv-pos04.jpg', marks: ['burn'], row: 'hpt1-ngv', position: 4 },
  { name: 'hpt1-ngv-pos05.jpg', marks: ['coating-loss'], row: 'hpt1-ngv', position: 5 },
  { name: 'hpt1-ngv-pos17.jpg', marks: ['none'], row: 'hpt1-ngv', position: 17 },
  { name: 'hpt1-blade-pos12.jpg', marks: ['crack'], row: 'hpt1-blade', position: 12 },
  {
    name: 'hpt1-blade-pos13.jpg',
    marks: ['coating-loss', 'crack'],
    row: 'hpt1-blade',
    position: 13,
  },
  { name: 'hpt1-blade-pos40.jpg', marks: ['none'], row: 'hpt1-blade', position: 40 },
];

/**
 * A draft inspection of the demo engine VT3-D0103 with invented stills, so that the demo has
 * images to browse from the first start. Runs after the demo scenario, outside its transaction,
 * because the stills are rendered and processed first.
 */
export async function loadDemoInspection(ctx: AppContext): Promise<void> {
  const now = ctx.now();
  const date = addDays(now.toISOString().slice(0, 10), -3);
  const prepared: {
    still: (typeof stills)[number];
    processed: ProcessedImage;
    sha256: string;
    bytes: number;
    file: string;
  }[] = [];
  for (const [index, still] of stills.entries()) {
    const jpeg = await rasteriseSvg(borescopeScene(101 + index * 7, still.marks));
    const file = await ctx.storage.writeTemp(jpeg);
    prepared.push({
      still,
      processed: await processImage(file),
      sha256: await ctx.storage.hash(file),
      bytes: jpeg.length,
      file,
    });
  }
  for (const item of prepared) await ctx.storage.commitOriginal(item.file, item.sha256);
  inTransaction(ctx.db, (tx) => {
    insertInspection(tx, {
      id: DEMO_INSPECTION_ID,
      engineId: 'engine-d0103',
      date,
      reason: 'scheduled',
      reasonDetail: 'Invented demo: routine hot-section look',
      csn: 9_440,
      tsn: 13_215,
      inspectorName: 'Tobias Rennick',
      qualificationRef: 'DEMO-BSI-L2-0457',
      qualificationExpiresOn: addDays(date, 300),
      probe: 'Demo probe VX-6, s/n DEMO-118',
      probeCalibrationDueOn: addDays(date, 120),
      rows: ['hpt1-ngv', 'hpt1-blade'],
      state: 'draft',
      flags: [],
      createdBy: 'user-inspector',
      createdAt: now,
    });
    prepared.forEach(({ still, processed, sha256, bytes }, index) => {
      insertImage(tx, {
        id: `${DEMO_INSPECTION_ID}-image-${index + 1}`,
        inspectionId: DEMO_INSPECTION_ID,
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
    appendAudit(tx, now, {
      actorUserId: null,
      action: 'demo.inspection-loaded',
      entityType: 'inspection',
      entityId: DEMO_INSPECTION_ID,
      after: { images: prepared.length },
    });
  });
}
