import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { TDocumentDefinitions } from 'pdfmake/interfaces';

export type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';

const require = createRequire(import.meta.url);

interface PdfMake {
  virtualfs: { writeFileSync(name: string, data: Buffer): void };
  addFonts(fonts: Record<string, Record<string, string>>): void;
  setUrlAccessPolicy(callback: (url: string) => boolean): void;
  setLocalAccessPolicy(callback: (file: string) => boolean): void;
  createPdf(doc: TDocumentDefinitions): { getBuffer(): Promise<Buffer> };
}

let engine: PdfMake | null = null;

/**
 * pdfmake with the fonts it ships (Roboto, from the registry package: no system font is read) in
 * its virtual file system, and every outside fetch refused: a document draws only what it holds.
 */
function pdfmake(): PdfMake {
  if (engine) return engine;
  const made = require('pdfmake') as PdfMake;
  const fonts = path.join(path.dirname(require.resolve('pdfmake/package.json')), 'fonts', 'Roboto');
  const faces = {
    normal: 'Roboto-Regular.ttf',
    bold: 'Roboto-Medium.ttf',
    italics: 'Roboto-Italic.ttf',
    bolditalics: 'Roboto-MediumItalic.ttf',
  };
  for (const file of Object.values(faces))
    made.virtualfs.writeFileSync(file, fs.readFileSync(path.join(fonts, file)));
  made.addFonts({ Roboto: faces });
  made.setUrlAccessPolicy(() => false);
  made.setLocalAccessPolicy(() => false);
  engine = made;
  return made;
}

/** Renders a document to PDF bytes. The one caller of pdfmake. */
export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
  return Buffer.from(await pdfmake().createPdf(doc).getBuffer());
}
