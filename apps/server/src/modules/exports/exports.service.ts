import type { Inspection } from '@emberline/contracts/inspections';
import type { ExportFormat, FleetExportQuery } from '@emberline/contracts/exports';
import { createFleetFindingsService } from '../fleet-findings/fleet-findings.service';
import { findingInspections } from '../fleet-findings/fleet-findings.repository';
import { todayIn } from '../planning/planning.service';
import type { AppContext } from '../../context';
import type { Principal } from '../../http/principal';
import { writeCsv } from '../../lib/csv';
import { writeXlsx } from '../../lib/xlsx/xlsx-writer';
import { createCoverageService } from '../coverage/coverage.service';
import { listModelRows } from '../engine-models/engine-models.repository';
import { createEnginesService } from '../engines/engines.service';
import { createFindingsService } from '../findings/findings.service';
import { listImages } from '../images/images.repository';
import { createInspectionsService } from '../inspections/inspections.service';
import { createReviewService } from '../review/review.service';
import { findingCells, findingHeader, type FindingLine } from './findings-table';

export interface ExportFile {
  contentType: string;
  filename: string;
  body: Buffer | string;
}

const contentTypes = {
  csv: 'text/csv; charset=utf-8',
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
} as const;

/**
 * Exports of findings (CSV and XLSX, one row a recorded finding, units in the headers) for an
 * inspection, an engine or the fleet, and of a whole inspection as JSON in the contract shapes.
 * Everything is read through the services the screens use, so that an export shows exactly what
 * its caller may see (an owner: released inspections, decisions as released).
 */
export function createExportsService(ctx: AppContext) {
  const engines = createEnginesService(ctx);
  const inspections = createInspectionsService(ctx);
  const findings = createFindingsService(ctx);
  const coverage = createCoverageService(ctx);
  const review = createReviewService(ctx);
  const search = createFleetFindingsService(ctx);

  /** The recorded findings of some inspections, each with its engine, row name and decision. */
  function linesOf(principal: Principal, of: readonly Inspection[]): FindingLine[] {
    const rowLabels = new Map<string, Map<string, string>>();
    const enginesSeen = new Map<string, ReturnType<typeof engines.detail>>();
    return of.flatMap((inspection) => {
      let engine = enginesSeen.get(inspection.engineId);
      if (!engine) {
        engine = engines.detail(principal, inspection.engineId);
        enginesSeen.set(inspection.engineId, engine);
      }
      let labels = rowLabels.get(engine.modelId);
      if (!labels) {
        labels = new Map(listModelRows(ctx.db, engine.modelId).map((row) => [row.key, row.label]));
        rowLabels.set(engine.modelId, labels);
      }
      const decisions = new Map(
        inspection.state === 'draft' || inspection.state === 'void'
          ? []
          : review
              .review(principal, inspection.id)
              .items.filter((item) => item.current)
              .map((item) => [item.findingId, item]),
      );
      const images = new Map(
        listImages(ctx.db, inspection.id).map((image) => [image.id, image.originalName]),
      );
      const modelRows = labels;
      return findings
        .list(principal, inspection.id)
        .items.filter((finding) => finding.status === 'recorded')
        .sort((a, b) => a.number - b.number)
        .map((finding) => ({
          engine: {
            serialNumber: engine.serialNumber,
            modelId: engine.modelId,
            modelName: engine.modelName,
            organisationId: engine.organisationId,
            organisationName: engine.organisationName,
          },
          inspection,
          finding,
          rowLabel: modelRows.get(finding.row) ?? finding.row,
          imageName: images.get(finding.imageId) ?? '',
          disposition: decisions.get(finding.id) ?? null,
        }));
    });
  }

  async function table(
    format: Exclude<ExportFormat, 'json'>,
    name: string,
    lines: readonly FindingLine[],
  ): Promise<ExportFile> {
    const rows = lines.map(findingCells);
    return {
      contentType: contentTypes[format],
      filename: `${name}.${format}`,
      body:
        format === 'csv'
          ? // A byte-order mark, so that spreadsheets open the file as UTF-8 (mm², names).
            `\uFEFF${writeCsv(findingHeader, rows)}`
          : await writeXlsx('Findings', findingHeader, rows),
    };
  }

  /** Inspections that hold records: every one but drafts and void ones (owners see released ones only). */
  const recorded = (list: readonly Inspection[]) =>
    list.filter((inspection) => inspection.state !== 'draft' && inspection.state !== 'void');

  return {
    async inspection(principal: Principal, id: string, format: ExportFormat): Promise<ExportFile> {
      const detail = inspections.detail(principal, id);
      const engine = engines.detail(principal, detail.engineId);
      const name = `emberline-findings-${engine.serialNumber}-${detail.date}`;
      if (format !== 'json') return table(format, name, linesOf(principal, [detail]));
      const document = {
        exportedAt: ctx.now().toISOString(),
        engine,
        inspection: detail,
        findings: findings.list(principal, id),
        coverage: coverage.coverage(principal, id),
        review:
          detail.state === 'draft' || detail.state === 'void' ? null : review.review(principal, id),
      };
      return {
        contentType: 'application/json; charset=utf-8',
        filename: `emberline-inspection-${engine.serialNumber}-${detail.date}.json`,
        body: `${JSON.stringify(document, null, 2)}\n`,
      };
    },

    async engine(
      principal: Principal,
      engineId: string,
      format: Exclude<ExportFormat, 'json'>,
    ): Promise<ExportFile> {
      const engine = engines.detail(principal, engineId);
      const list = recorded(inspections.ofEngine(principal, engineId));
      return table(format, `emberline-findings-${engine.serialNumber}`, linesOf(principal, list));
    },

    /**
     * The findings the fleet search selects, in its order, up to `findingExportLimit` (the file
     * then says in its name that it holds the first of them).
     */
    async fleet(principal: Principal, query: FleetExportQuery): Promise<ExportFile> {
      const { format, ...selection } = query;
      const { ids, total } = search.matchingIds(principal, selection);
      const order = new Map(ids.map((id, index) => [id, index]));
      const inspectionIds = [...new Set(findingInspections(ctx.db, ids))];
      const lines = linesOf(
        principal,
        inspectionIds.map((id) => inspections.detail(principal, id)),
      )
        .filter((line) => order.has(line.finding.id))
        .sort((a, b) => order.get(a.finding.id)! - order.get(b.finding.id)!);
      const day = todayIn(ctx.config.timeZone, ctx.now());
      const name =
        total > ids.length
          ? `emberline-findings-fleet-${day}-first-${ids.length}-of-${total}`
          : `emberline-findings-fleet-${day}`;
      return table(format, name, lines);
    },
  };
}
