import fs from 'node:fs/promises';
import exifReader from 'exif-reader';
import sharp, { type Metadata } from 'sharp';

// Renditions are cached nowhere but in SQLite and on disk: libvips' operation cache only grows
// memory under a stream of distinct images.
sharp.cache(false);

/** Largest image accepted: 120 megapixels, above any borescope camera; a 20000×20000 bomb is refused from its header. */
export const MAX_INPUT_PIXELS = 120_000_000;
export const THUMBNAIL_PX = 320;
export const PREVIEW_PX = 1600;

export type ImageFormat = 'jpeg' | 'png' | 'tiff' | 'webp';

export class ImageRefusal extends Error {
  override name = 'ImageRefusal';
  constructor(
    readonly code: 'unsupported_type' | 'too_many_pixels' | 'unreadable',
    message: string,
  ) {
    super(message);
  }
}

export interface ProcessedImage {
  format: ImageFormat;
  /** As displayed, after the EXIF orientation is applied. */
  width: number;
  height: number;
  capturedAt: string | null;
  thumbnail: Buffer;
  thumbnailType: string;
  preview: Buffer;
  previewType: string;
}

/** The format by the file's first bytes, whatever its name says. */
export function sniffFormat(head: Buffer): ImageFormat | null {
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'jpeg';
  if (
    head.length >= 8 &&
    head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))
  )
    return 'png';
  if (
    head.length >= 4 &&
    (head.subarray(0, 4).equals(Buffer.from([0x49, 0x49, 0x2a, 0x00])) ||
      head.subarray(0, 4).equals(Buffer.from([0x4d, 0x4d, 0x00, 0x2a])))
  )
    return 'tiff';
  if (
    head.length >= 12 &&
    head.toString('latin1', 0, 4) === 'RIFF' &&
    head.toString('latin1', 8, 12) === 'WEBP'
  )
    return 'webp';
  return null;
}

function describeContent(head: Buffer): string {
  const start = head.toString('utf8', 0, 200).trimStart().toLowerCase();
  if (start.startsWith('<svg') || (start.startsWith('<?xml') && start.includes('<svg')))
    return 'an SVG drawing';
  if (start.startsWith('<!doctype html') || start.startsWith('<html')) return 'an HTML page';
  if (head.toString('latin1', 4, 8) === 'ftyp') return 'a video';
  return 'not an image Emberline reads';
}

async function readHead(file: string): Promise<Buffer> {
  const handle = await fs.open(file, 'r');
  try {
    const buffer = Buffer.alloc(256);
    const { bytesRead } = await handle.read(buffer, 0, 256, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

function captureTime(exif: Buffer | undefined): string | null {
  if (!exif) return null;
  try {
    const parsed = exifReader(exif);
    const taken = parsed.Photo?.DateTimeOriginal ?? parsed.Image?.DateTime;
    return taken instanceof Date && !Number.isNaN(taken.getTime()) ? taken.toISOString() : null;
  } catch {
    return null;
  }
}

/**
 * Reads an upload and makes its renditions with one decode: the image is oriented and shrunk once
 * to the preview size (JPEG shrinks on load), and the thumbnail comes from that. Renditions carry
 * no metadata (no EXIF, no GPS). The preview is JPEG q80 and the thumbnail WebP q70 effort 2: see
 * docs/decisions/003-image-renditions.md for the measurements behind that choice.
 */
export async function processImage(file: string): Promise<ProcessedImage> {
  const head = await readHead(file);
  const format = sniffFormat(head);
  if (!format)
    throw new ImageRefusal(
      'unsupported_type',
      `This file is ${describeContent(head)}: Emberline takes JPEG, PNG, TIFF and WebP images.`,
    );
  let metadata: Metadata;
  try {
    // The header alone: no pixel is decoded here, so the size check below stays cheap for a bomb.
    metadata = await sharp(file, { limitInputPixels: false }).metadata();
  } catch {
    throw new ImageRefusal(
      'unreadable',
      'The image could not be read; the file may be damaged or cut short.',
    );
  }
  const pixels = (metadata.width ?? 0) * (metadata.height ?? 0);
  if (pixels > MAX_INPUT_PIXELS) {
    throw new ImageRefusal(
      'too_many_pixels',
      `The image is ${metadata.width}×${metadata.height} pixels; Emberline takes up to ${MAX_INPUT_PIXELS / 1_000_000} megapixels.`,
    );
  }
  const rotated = (metadata.orientation ?? 1) >= 5;
  const width = rotated ? metadata.height! : metadata.width!;
  const height = rotated ? metadata.width! : metadata.height!;
  try {
    const { data, info } = await sharp(file, {
      limitInputPixels: MAX_INPUT_PIXELS,
      failOn: 'error',
    })
      .autoOrient()
      .resize(PREVIEW_PX, PREVIEW_PX, { fit: 'inside', withoutEnlargement: true })
      .removeAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const raw = {
      raw: { width: info.width, height: info.height, channels: info.channels },
    } as const;
    const [preview, thumbnail] = await Promise.all([
      sharp(data, raw).jpeg({ quality: 80 }).toBuffer(),
      sharp(data, raw)
        .resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside', withoutEnlargement: true })
        .webp({ quality: 70, effort: 2 })
        .toBuffer(),
    ]);
    return {
      format,
      width,
      height,
      capturedAt: captureTime(metadata.exif),
      thumbnail,
      thumbnailType: 'image/webp',
      preview,
      previewType: 'image/jpeg',
    };
  } catch (error) {
    if (error instanceof ImageRefusal) throw error;
    throw new ImageRefusal(
      'unreadable',
      'The image could not be decoded; the file may be damaged or cut short.',
    );
  }
}

// A bounded queue: at most two pipelines decode at once, so memory stays flat however many
// files arrive together; the rest wait their turn.
const MAX_IN_FLIGHT = 2;
let inFlight = 0;
const waiting: (() => void)[] = [];

async function slot<T>(work: () => Promise<T>): Promise<T> {
  if (inFlight >= MAX_IN_FLIGHT) await new Promise<void>((resolve) => waiting.push(resolve));
  inFlight += 1;
  try {
    return await work();
  } finally {
    inFlight -= 1;
    waiting.shift()?.();
  }
}

/** processImage through the bounded queue. */
export function processImageQueued(file: string): Promise<ProcessedImage> {
  return slot(() => processImage(file));
}

/** The full-resolution, oriented rendition in a format browsers show (JPEG q90), without metadata. */
/** Renders an original as the full-resolution oriented JPEG into `target` (a temp file). */
export async function renderFull(original: string, target: string): Promise<void> {
  await slot(() =>
    sharp(original, { limitInputPixels: MAX_INPUT_PIXELS })
      .autoOrient()
      .removeAlpha()
      .jpeg({ quality: 90 })
      .toFile(target),
  );
}

/** Renders an SVG drawing to a JPEG, for the invented demo stills. */
export async function rasteriseSvg(svg: string, quality = 86): Promise<Buffer> {
  return sharp(Buffer.from(svg)).flatten({ background: '#000' }).jpeg({ quality }).toBuffer();
}

/** Renders an SVG drawing (a stage ring) to a PNG of the given width, for the report. */
export async function svgToPng(svg: string, width: number): Promise<Buffer> {
  return sharp(Buffer.from(svg)).resize({ width }).png().toBuffer();
}

/**
 * Draws an overlay (SVG in the original image's pixel frame) over a rendition of that image, for
 * the report: the rendition's size is kept, the overlay scaled to it.
 */
export async function drawOverJpeg(
  rendition: Buffer,
  overlaySvg: string,
  originalWidth: number,
  originalHeight: number,
): Promise<{ jpeg: Buffer; width: number; height: number }> {
  const base = sharp(rendition);
  const { width = originalWidth, height = originalHeight } = await base.metadata();
  const scaled = overlaySvg.replace(
    /^<svg([^>]*?)>/,
    (_match, attrs: string) =>
      `<svg${attrs
        .replace(/\swidth="[^"]*"/, '')
        .replace(/\sheight="[^"]*"/, '')
        .replace(
          /\sviewBox="[^"]*"/,
          '',
        )} width="${width}" height="${height}" viewBox="0 0 ${originalWidth} ${originalHeight}">`,
  );
  const jpeg = await base
    .composite([{ input: Buffer.from(scaled), top: 0, left: 0 }])
    .jpeg({ quality: 82 })
    .toBuffer();
  return { jpeg, width, height };
}
