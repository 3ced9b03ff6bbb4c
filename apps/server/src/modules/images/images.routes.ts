import {
  Router,
  type ErrorRequestHandler,
  type Request,
  type RequestHandler,
  type Response,
} from 'express';
import { pipeline } from 'node:stream/promises';
import multer from 'multer';
import { createRequestLimiter, requestLimits } from '../../http/rate-limit';
import {
  imageSchema,
  imageCalibrationInputSchema,
  imageTagInputSchema,
  uploadResponseSchema,
} from '@emberline/contracts/inspections';
import { idParamsSchema } from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import type { StoredBytes } from '../../lib/storage/image-storage';
import { createImagesService, displayName, type FrameSource } from './images.service';
import { hashingStorage, type ReceivedFile } from './upload-storage';

export const UPLOAD_LIMITS = {
  fileSize: 64 * 1024 * 1024,
  files: 200,
  fields: 10,
  parts: 212,
  fieldSize: 1024,
} as const;

const frameFieldsSchema = z.strictObject({
  videoFileName: z.string().trim().min(1).max(200).optional(),
  videoTimeSeconds: z.coerce.number().finite().min(0).max(86_400).optional(),
});

const limitMessages: Record<string, string> = {
  LIMIT_FILE_SIZE: `A file is over the ${UPLOAD_LIMITS.fileSize / 1024 / 1024} MB limit; nothing in this batch was stored.`,
  LIMIT_FILE_COUNT: `At most ${UPLOAD_LIMITS.files} files go in one upload; nothing in this batch was stored.`,
  LIMIT_PART_COUNT: 'The upload has too many parts; nothing in this batch was stored.',
  LIMIT_FIELD_COUNT: 'The upload has too many fields; nothing in this batch was stored.',
  LIMIT_FIELD_VALUE: 'A field of the upload is too long; nothing in this batch was stored.',
  LIMIT_FIELD_KEY: 'A field name of the upload is too long; nothing in this batch was stored.',
  LIMIT_UNEXPECTED_FILE: 'Files go in the field "files"; nothing in this batch was stored.',
};

/** Multer's limit errors as the upload's own answer: 413 (400 for a wrong field) with the refused files. */
const uploadErrors: ErrorRequestHandler = (error, req, res, next) => {
  // A connection cut mid-upload: the client's doing, answered (if anyone still listens) as such;
  // multer has removed what it received, and the storage the part it was writing.
  if (
    !(error instanceof multer.MulterError) &&
    (req.readableAborted || /Unexpected end of form|aborted/i.test(String(error?.message)))
  ) {
    res.status(400).json({
      error: {
        code: 'invalid_request',
        message: 'The upload was cut off before it finished; nothing was stored.',
        requestId: String(req.id ?? ''),
      },
    });
    return;
  }
  if (!(error instanceof multer.MulterError)) return next(error);
  const status = error.code === 'LIMIT_UNEXPECTED_FILE' ? 400 : 413;
  const message = limitMessages[error.code] ?? 'The upload could not be read; nothing was stored.';
  res.status(status).json({
    error: {
      code: status === 413 ? 'payload_too_large' : 'invalid_request',
      message,
      requestId: String(req.id ?? ''),
    },
    images: [],
    rejected: [{ filename: displayName(error.field ?? 'upload'), code: 'too_large', message }],
  });
};

/**
 * Streams stored bytes (from the disk or the bucket) with their content address as a strong
 * ETag: a browser that has them gets a 304 and no bytes.
 */
async function sendStored(
  req: Request,
  res: Response,
  bytes: StoredBytes,
  type: string,
  etag: string,
): Promise<void> {
  res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
  res.setHeader('ETag', `"${etag}"`);
  if (req.headers['if-none-match'] === `"${etag}"`) {
    bytes.stream.destroy();
    res.status(304).end();
    return;
  }
  res.setHeader('Content-Type', type);
  res.setHeader('Content-Length', String(bytes.size));
  try {
    await pipeline(bytes.stream, res);
  } catch (error) {
    // The reader went away, or the store failed mid-way: the answer is cut off, not replaced.
    if (res.headersSent) {
      res.destroy();
      return;
    }
    throw error;
  }
}

function sendBuffer(res: Response, data: Buffer, type: string, etag: string): void {
  res.setHeader('Content-Type', type);
  res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
  res.setHeader('ETag', `"${etag}"`);
  res.setHeader('Content-Disposition', 'inline');
  res.end(data);
}

export function imagesRoutes(ctx: AppContext): Router {
  const router = Router();
  const images = createImagesService(ctx);
  const upload = multer({
    storage: hashingStorage(ctx.storage),
    limits: UPLOAD_LIMITS,
    // Browsers send file names as UTF-8 without saying so; busboy's default would read them as
    // Latin-1 ("Düse.jpg" became "DÃ¼se.jpg").
    defParamCharset: 'utf8',
  });
  const beforeBytes: RequestHandler = (req, res, next) => {
    images.assertCanUpload(principalOf(res), String(req.params.id));
    next();
  };

  route(
    router,
    'POST /inspections/:id/images',
    {
      summary: 'Upload images (multipart, field "files"); accepted and refused files with reasons',
      params: idParamsSchema,
      response: uploadResponseSchema,
      status: 201,
      limit: createRequestLimiter(requestLimits.upload, ctx.now),
    },
    beforeBytes,
    upload.array('files', UPLOAD_LIMITS.files),
    // Express tells an error handler by its four parameters; the cast only satisfies the type.
    uploadErrors as unknown as RequestHandler,
    async (req, res) => {
      const files = (req.files as ReceivedFile[] | undefined) ?? [];
      try {
        await answerUpload(req, res, files);
      } finally {
        // Whatever the answer, no temp file of this request outlives it: a stored file has been
        // moved to its address already, and discarding a moved file does nothing.
        await Promise.all(files.map((file) => ctx.storage.discard(file.path)));
      }
    },
  );

  async function answerUpload(req: Request, res: Response, files: ReceivedFile[]) {
    const fields = frameFieldsSchema.safeParse(req.body ?? {});
    if (!fields.success) throw AppError.badRequest('The upload has fields Emberline does not take');
    const frame: FrameSource | null =
      fields.data.videoFileName !== undefined && fields.data.videoTimeSeconds !== undefined
        ? {
            videoFileName: fields.data.videoFileName,
            videoTimeSeconds: fields.data.videoTimeSeconds,
          }
        : null;
    const { status, body } = await images.upload(
      principalOf(res),
      res.locals.params.id,
      files,
      frame,
      requestMeta(req),
    );
    if (status !== 415) {
      res.status(status).json(body);
      return;
    }
    // Nothing was taken: an error answer that still lists every refused file and its reason.
    res.status(415).json({
      ...body,
      error: {
        code: 'unsupported_media_type',
        message: 'None of the files could be taken.',
        requestId: String(req.id ?? ''),
      },
    });
  }

  route(
    router,
    'PATCH /images/:id',
    {
      summary: 'Tag an image with the row and position it shows',
      params: idParamsSchema,
      body: imageTagInputSchema,
      response: imageSchema,
    },
    (req, res) => {
      res.json(
        images.tag(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );

  route(
    router,
    'PUT /images/:id/calibration',
    {
      summary:
        'Save the scale of a still: picked on it, or reused from a still of the same size and port',
      params: idParamsSchema,
      body: imageCalibrationInputSchema,
      response: imageSchema,
    },
    (req, res) => {
      res.json(
        images.calibrate(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );

  for (const which of ['thumbnail', 'preview'] as const) {
    route(
      router,
      `GET /images/:id/${which}`,
      {
        summary: which === 'thumbnail' ? 'About 320 px, WebP' : 'About 1600 px, JPEG',
        params: idParamsSchema,
      },
      (_req, res) => {
        const rendition = images.rendition(principalOf(res), res.locals.params.id, which);
        sendBuffer(res, rendition.data, rendition.type, `${rendition.sha256}-${which}`);
      },
    );
  }

  route(
    router,
    'GET /images/:id/full',
    { summary: 'Full resolution, oriented, JPEG', params: idParamsSchema },
    async (req, res) => {
      const full = await images.full(principalOf(res), res.locals.params.id);
      res.setHeader('Content-Disposition', 'inline');
      await sendStored(req, res, full.bytes, 'image/jpeg', `${full.sha256}-full`);
    },
  );

  route(
    router,
    'GET /images/:id/original',
    { summary: 'The bytes as uploaded, as a download', params: idParamsSchema },
    async (req, res) => {
      const { bytes, image } = await images.original(principalOf(res), res.locals.params.id);
      const type = { jpeg: 'image/jpeg', png: 'image/png', tiff: 'image/tiff', webp: 'image/webp' }[
        image.format
      ];
      const ascii = image.originalName.replace(/[^\x20-\x7e]/g, '_');
      res.setHeader(
        'Content-Disposition',
        `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(image.originalName)}`,
      );
      await sendStored(req, res, bytes, type, image.sha256);
    },
  );

  return router;
}
