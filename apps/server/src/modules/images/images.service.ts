import type { Calibration } from '@emberline/contracts/measurement';
import {
  assertCalibration,
  calibrationPoints,
  pointsOffImage,
} from '@emberline/domain/measurement';
import type {
  Image,
  ImageCalibrationInput,
  ImageTagInput,
  RejectedFile,
  UploadResponse,
} from '@emberline/contracts/inspections';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction } from '../../db/client';
import { AppError } from '../../http/app-error';
import { recordScope } from '../../http/record-access';
import type { Principal } from '../../http/principal';
import { newId } from '../../lib/ids';
import { ImageRefusal, processImageQueued, renderFull } from '../../lib/images/image-pipeline';
import type { StoredBytes } from '../../lib/storage/image-storage';
import { appendAudit } from '../audit/audit.repository';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRow } from '../engines/engines.repository';
import { draftInspection, visibleInspection } from '../inspections/inspection-access';
import {
  calibrateImage,
  findImageBySha,
  findImageMeta,
  insertImage,
  readRendition,
  tagImage,
  type ImageMeta,
} from './images.repository';
import { toImage } from './image-view';

export interface UploadedFile {
  path: string;
  originalname: string;
  size: number;
  /** Computed while the upload was written. */
  sha256: string;
}

export interface FrameSource {
  videoFileName: string;
  videoTimeSeconds: number;
}

/** A file name fit to show and to offer in Content-Disposition: no path, no control characters. */
export function displayName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const clean = [...base]
    .filter((char) => char.charCodeAt(0) >= 0x20 && char.charCodeAt(0) !== 0x7f && char !== '"')
    .join('')
    .trim()
    .slice(0, 200);
  return clean || 'image';
}

export function createImagesService(ctx: AppContext) {
  const { db, storage } = ctx;

  /**
   * The stores under way, by inspection and hash: the same bytes sent twice in one request, or in
   * parallel requests, wait for the first and are answered as its duplicates (one row, never a
   * UNIQUE failure). Each store is entered here before its first await.
   */
  const storing = new Map<string, Promise<Image | RejectedFile>>();
  /** Full renditions being made, by the original's hash. */
  const rendering = new Map<string, Promise<void>>();

  async function ingest(
    principal: Principal,
    inspectionId: string,
    file: UploadedFile,
    frame: FrameSource | null,
    meta: RequestMeta,
  ): Promise<Image | RejectedFile> {
    const filename = displayName(file.originalname);
    // Hashed while it arrived: a duplicate costs no decode.
    const { sha256 } = file;
    const key = `${inspectionId}:${sha256}`;
    const existing = findImageBySha(db, inspectionId, sha256);
    const first = storing.get(key);
    if (existing || first) {
      await storage.discard(file.path);
      const earlier = existing ? null : first ? await first.catch(() => null) : null;
      // The first of the same bytes was refused: this one is, for the same reason.
      if (earlier && !('id' in earlier)) return { ...earlier, filename };
      const imageId = existing?.id ?? earlier?.id;
      return {
        filename,
        code: 'duplicate',
        message: 'The same image is already in this inspection; it was not stored twice.',
        ...(imageId ? { imageId } : {}),
      };
    }
    const work = store(principal, inspectionId, file, filename, frame, meta);
    storing.set(key, work);
    try {
      return await work;
    } finally {
      storing.delete(key);
    }
  }

  async function store(
    principal: Principal,
    inspectionId: string,
    file: UploadedFile,
    filename: string,
    frame: FrameSource | null,
    meta: RequestMeta,
  ): Promise<Image | RejectedFile> {
    const { sha256 } = file;
    try {
      const processed = await processImageQueued(file.path);
      // The original is in place (fsync, rename) before its record commits.
      await storage.commitOriginal(file.path, sha256);
      const id = newId();
      const now = ctx.now();
      inTransaction(db, (tx) => {
        insertImage(tx, {
          id,
          inspectionId,
          sha256,
          format: processed.format,
          bytes: file.size,
          width: processed.width,
          height: processed.height,
          originalName: filename,
          capturedAt: processed.capturedAt,
          source: frame ? 'video-frame' : 'upload',
          videoFileName: frame?.videoFileName ?? null,
          videoTimeSeconds: frame?.videoTimeSeconds ?? null,
          thumbnail: processed.thumbnail,
          thumbnailType: processed.thumbnailType,
          preview: processed.preview,
          previewType: processed.previewType,
          createdBy: principal.user.id,
          createdAt: now,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'image.added',
          entityType: 'image',
          entityId: id,
          after: {
            inspectionId,
            sha256,
            filename,
            width: processed.width,
            height: processed.height,
            ...(frame ?? {}),
          },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toImage(findImageMeta(db, id)!);
    } catch (error) {
      await storage.discard(file.path);
      if (error instanceof ImageRefusal)
        return { filename, code: error.code, message: error.message };
      throw error;
    }
  }

  /** The image when the caller may see its inspection; 404 otherwise. */
  function visibleImage(principal: Principal, id: string): ImageMeta {
    const image = findImageMeta(db, id);
    if (!image) throw AppError.notFound('There is no such image');
    visibleInspection(db, principal, image.inspectionId, 'There is no such image');
    return image;
  }

  return {
    /** Checks, before any byte is taken, that images may be added to this inspection. */
    assertCanUpload(principal: Principal, inspectionId: string): void {
      draftInspection(db, principal, inspectionId);
    },

    async upload(
      principal: Principal,
      inspectionId: string,
      files: UploadedFile[],
      frame: FrameSource | null,
      meta: RequestMeta,
    ): Promise<{ status: number; body: UploadResponse }> {
      draftInspection(db, principal, inspectionId);
      const outcomes = await Promise.all(
        files.map((file) => ingest(principal, inspectionId, file, frame, meta)),
      );
      const images = outcomes.filter((outcome): outcome is Image => 'id' in outcome);
      const rejected = outcomes.filter((outcome): outcome is RejectedFile => !('id' in outcome));
      if (files.length === 0)
        throw AppError.badRequest('Choose at least one image to upload, in the field "files"');
      if (images.length > 0 || rejected.every((item) => item.code === 'duplicate'))
        return { status: images.length > 0 ? 201 : 200, body: { images, rejected } };
      return { status: 415, body: { images, rejected } };
    },

    tag(principal: Principal, id: string, input: ImageTagInput, meta: RequestMeta): Image {
      const image = visibleImage(principal, id);
      const inspection = draftInspection(db, principal, image.inspectionId);
      if ((input.rowKey === null) !== (input.position === null))
        throw AppError.unprocessable('Give both the row and the position, or neither');
      if (input.rowKey !== null) {
        const engine = findEngineRow(db, inspection.engineId)!;
        const row = listModelRows(db, engine.modelId).find(
          (candidate) => candidate.key === input.rowKey,
        );
        if (!row || !inspection.rows.includes(input.rowKey))
          throw AppError.unprocessable(
            `${row?.label ?? 'That row'} is not listed for this inspection: choose one of its rows`,
          );
        if (input.position! > row.count)
          throw AppError.unprocessable(
            `Position ${input.position} is outside ${row.label}, which has positions 1 to ${row.count}`,
          );
      }
      const tag = {
        rowKey: input.rowKey,
        position: input.position,
        ...(input.port !== undefined ? { port: input.port } : {}),
      };
      const now = ctx.now();
      inTransaction(db, (tx) => {
        tagImage(tx, id, tag);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'image.tagged',
          entityType: 'image',
          entityId: id,
          before: { rowKey: image.rowKey, position: image.position, port: image.port },
          after: { port: image.port, ...tag },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toImage(findImageMeta(db, id)!);
    },

    /**
     * Saves the scale of a still the moment it is picked: one picked on this still (its points
     * inside it), or the scale of another still of this inspection with the same size and port.
     */
    calibrate(
      principal: Principal,
      id: string,
      input: ImageCalibrationInput,
      meta: RequestMeta,
    ): Image {
      const image = visibleImage(principal, id);
      draftInspection(db, principal, image.inspectionId);
      let saved: { calibration: Calibration; calibrationImageId: string };
      if ('calibration' in input) {
        const off = pointsOffImage(calibrationPoints(input.calibration), image.width, image.height);
        if (off) throw AppError.unprocessable(off);
        assertCalibration(input.calibration);
        saved = { calibration: input.calibration, calibrationImageId: id };
      } else {
        const source = findImageMeta(db, input.fromImageId);
        if (!source || source.inspectionId !== image.inspectionId)
          throw AppError.unprocessable('That image is not in this inspection');
        if (!source.calibration)
          throw AppError.unprocessable(`${source.originalName} has no scale to reuse`);
        if (source.width !== image.width || source.height !== image.height)
          throw AppError.unprocessable(
            `${source.originalName} is ${source.width}×${source.height} pixels and this still ${image.width}×${image.height}: reuse a scale only from a still of the same size`,
          );
        if ((source.port ?? null) !== (image.port ?? null))
          throw AppError.unprocessable(
            `${source.originalName} was taken through ${source.port ?? 'no named port'} and this still through ${image.port ?? 'no named port'}: reuse a scale only from a still of the same port`,
          );
        saved = {
          calibration: source.calibration,
          calibrationImageId: source.calibrationImageId ?? source.id,
        };
      }
      const now = ctx.now();
      inTransaction(db, (tx) => {
        calibrateImage(tx, id, saved);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'image.calibrated',
          entityType: 'image',
          entityId: id,
          before: { calibration: image.calibration, calibrationImageId: image.calibrationImageId },
          after: saved,
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return toImage(findImageMeta(db, id)!);
    },

    rendition(principal: Principal, id: string, which: 'thumbnail' | 'preview') {
      visibleImage(principal, id);
      return readRendition(db, id, which)!;
    },

    /** The full-resolution oriented JPEG, made on first request and stored beside the original. */
    async full(principal: Principal, id: string): Promise<{ bytes: StoredBytes; sha256: string }> {
      const image = visibleImage(principal, id);
      const { sha256 } = image;
      let bytes = await storage.openFull(sha256);
      if (!bytes) {
        // One render a rendition: parallel first requests wait for it and send the same bytes.
        let render = rendering.get(sha256);
        if (!render) {
          render = (async () => {
            const rendered = storage.tempFile('.jpg');
            try {
              await storage.withOriginalFile(sha256, (original) => renderFull(original, rendered));
              await storage.commitFull(rendered, sha256);
            } finally {
              await storage.discard(rendered);
            }
          })().finally(() => rendering.delete(sha256));
          rendering.set(sha256, render);
        }
        await render;
        bytes = await storage.openFull(sha256);
        if (!bytes) throw new Error(`The full rendition of ${sha256} was made but cannot be read`);
      }
      return { bytes, sha256 };
    },

    /**
     * The bytes as uploaded, for staff only: they carry the probe's metadata (a position
     * included). Owners get renditions; to them an original answers as an unknown image.
     */
    async original(
      principal: Principal,
      id: string,
    ): Promise<{ bytes: StoredBytes; image: ImageMeta }> {
      if (recordScope(principal).releasedOnly) throw AppError.notFound('There is no such image');
      const image = visibleImage(principal, id);
      const bytes = await storage.openOriginal(image.sha256);
      if (!bytes)
        throw new Error(`The original ${image.sha256} of image ${image.id} is not in storage`);
      return { bytes, image };
    },
  };
}
