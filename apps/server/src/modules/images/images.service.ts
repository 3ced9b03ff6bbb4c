import type {
  Image,
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
import { appendAudit } from '../audit/audit.repository';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findEngineRow } from '../engines/engines.repository';
import { draftInspection, visibleInspection } from '../inspections/inspection-access';
import {
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

  async function ingest(
    principal: Principal,
    inspectionId: string,
    file: UploadedFile,
    frame: FrameSource | null,
    seen: Set<string>,
    meta: RequestMeta,
  ): Promise<Image | RejectedFile> {
    const filename = displayName(file.originalname);
    try {
      // Hashed while it arrived: a duplicate costs no decode.
      const { sha256 } = file;
      const existing = findImageBySha(db, inspectionId, sha256);
      if (existing || seen.has(sha256)) {
        await storage.discard(file.path);
        return {
          filename,
          code: 'duplicate',
          message: 'The same image is already in this inspection; it was not stored twice.',
          ...(existing ? { imageId: existing.id } : {}),
        };
      }
      seen.add(sha256);
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
    visibleInspection(db, principal, image.inspectionId);
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
      const seen = new Set<string>();
      const outcomes = await Promise.all(
        files.map((file) => ingest(principal, inspectionId, file, frame, seen, meta)),
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
        if (!inspection.rows.includes(input.rowKey))
          throw AppError.unprocessable(`The row ${input.rowKey} is not listed for this inspection`);
        const engine = findEngineRow(db, inspection.engineId)!;
        const row = listModelRows(db, engine.modelId).find(
          (candidate) => candidate.key === input.rowKey,
        )!;
        if (input.position! > row.count)
          throw AppError.unprocessable(
            `Position ${input.position} is outside ${row.key}, which has positions 1 to ${row.count}`,
          );
      }
      const now = ctx.now();
      inTransaction(db, (tx) => {
        tagImage(tx, id, input);
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'image.tagged',
          entityType: 'image',
          entityId: id,
          before: { rowKey: image.rowKey, position: image.position },
          after: input,
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

    /** The full-resolution oriented JPEG, made on first request and kept on disk. */
    async full(principal: Principal, id: string): Promise<{ path: string; sha256: string }> {
      const image = visibleImage(principal, id);
      const target = storage.fullPath(image.sha256);
      if (!(await storage.exists(target)))
        await renderFull(storage.originalPath(image.sha256), target);
      return { path: target, sha256: image.sha256 };
    },

    /**
     * The bytes as uploaded, for staff only: they carry the probe's metadata (a position
     * included). Owners get renditions; to them an original answers as an unknown image.
     */
    original(principal: Principal, id: string): { path: string; image: ImageMeta } {
      if (recordScope(principal).releasedOnly) throw AppError.notFound('There is no such image');
      const image = visibleImage(principal, id);
      return { path: storage.originalPath(image.sha256), image };
    },
  };
}
