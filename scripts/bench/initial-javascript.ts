import fs from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';

const CEILING_BYTES = 200 * 1024;

/** Gzip size of the JavaScript the built index.html loads before anything is lazy-loaded. */
export async function benchInitialJavaScript() {
  const dist = path.resolve('apps/web/dist');
  const html = fs.readFileSync(path.join(dist, 'index.html'), 'utf8');
  const scripts = [
    ...html.matchAll(/<(?:script[^>]*src|link[^>]*rel="modulepreload"[^>]*href)="([^"]+\.js)"/g),
  ].map((match) => match[1]!);
  const bytes = scripts.reduce(
    (total, src) => total + gzipSync(fs.readFileSync(path.join(dist, src))).length,
    0,
  );
  return {
    name: 'initial JavaScript of the client (gzip)',
    figure: `${(bytes / 1024).toFixed(1)} KB`,
    ceiling: `${CEILING_BYTES / 1024} KB`,
    ok: bytes <= CEILING_BYTES,
  };
}
