import type { Image } from '@emberline/contracts/inspections';
import type { ImageMeta } from './images.repository';

export function toImage(row: ImageMeta): Image {
  return {
    id: row.id,
    inspectionId: row.inspectionId,
    sha256: row.sha256,
    width: row.width,
    height: row.height,
    format: row.format,
    bytes: row.bytes,
    originalName: row.originalName,
    capturedAt: row.capturedAt,
    source: row.source,
    videoFileName: row.videoFileName,
    videoTimeSeconds: row.videoTimeSeconds,
    rowKey: row.rowKey,
    position: row.position,
    port: row.port,
    calibration: row.calibration
      ? { calibration: row.calibration, sourceImageId: row.calibrationImageId ?? row.id }
      : null,
    createdAt: row.createdAt.toISOString(),
  };
}
