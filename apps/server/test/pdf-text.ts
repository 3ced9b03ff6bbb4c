/** The text of every page, as an independent reader (pdf.js) extracts it. */
export async function pdfText(bytes: Buffer): Promise<{ pages: number; text: string }> {
  // pdf.js 6 expects Promise.withResolvers, which Node 20 lacks.
  const promise = Promise as unknown as { withResolvers?: () => unknown };
  promise.withResolvers ??= () => {
    let resolve!: (value: unknown) => void;
    let reject!: (reason: unknown) => void;
    const made = new Promise((yes, no) => {
      resolve = yes;
      reject = no;
    });
    return { promise: made, resolve, reject };
  };
  const { getDocument } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const document = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false })
    .promise;
  const pages: string[] = [];
  for (let number = 1; number <= document.numPages; number += 1) {
    const content = await (await document.getPage(number)).getTextContent();
    pages.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' '));
  }
  return { pages: document.numPages, text: pages.join('\n').replace(/\s+/g, ' ') };
}
