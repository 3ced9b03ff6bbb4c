import type { Content, TDocumentDefinitions } from '../../lib/pdf/pdf-renderer';
import { cautions } from '@emberline/contracts/cautions';

/** Everything a report shows, already in words: the document below only lays it out. */
export interface ReportContent {
  revision: number;
  replacesRevision: number | null;
  verificationCode: string;
  verifyUrl: string;
  issuedOn: string;
  engine: { rows: [string, string][] };
  inspection: { rows: [string, string][] };
  outcome: { decision: string; lines: string[]; signedBy: string };
  nextDue: string;
  limitSet: string;
  coverage: { row: string; status: string; viewed: string; note: string }[];
  rings: { row: string; png: Buffer }[];
  findings: {
    number: string;
    row: string;
    position: string;
    zone: string;
    damage: string;
    measurement: string;
    verdict: string;
    decision: string;
    concession: string;
    signer: string;
  }[];
  images: { caption: string; jpeg: Buffer; width: number; height: number }[];
  trends: { caption: string; lines: string[]; chart: { png: Buffer; width: number } }[];
  signatures: { kind: string; signer: string; signedAt: string; sha256: string }[];
  chainHead: string;
}

const dataUrl = (type: string, bytes: Buffer) => `data:${type};base64,${bytes.toString('base64')}`;
const heading = (text: string): Content => ({ text, style: 'heading' });
const keyValues = (rows: [string, string][]): Content => ({
  table: {
    widths: [150, '*'],
    body: rows.map(([key, value]) => [
      { text: key, style: 'key' },
      { text: value, style: 'value' },
    ]),
  },
  layout: 'lightHorizontalLines',
});

/**
 * The report's layout (Emberline's own): particulars, outcome and next due, coverage with the stage
 * rings, the findings, their annotated images, the damage trends, the signature records and the
 * verification code; the cautions and the page numbers in every footer.
 */
export function reportDocument(content: ReportContent): TDocumentDefinitions {
  const title = `Hot-section borescope inspection report, revision ${content.revision}`;
  return {
    info: { title, creator: 'Emberline', producer: 'Emberline' },
    pageSize: 'A4',
    pageMargins: [40, 56, 40, 70],
    defaultStyle: { font: 'Roboto', fontSize: 9, lineHeight: 1.2 },
    styles: {
      title: { fontSize: 16, bold: true, margin: [0, 0, 0, 4] },
      heading: { fontSize: 12, bold: true, margin: [0, 14, 0, 6] },
      key: { color: '#57534e' },
      value: { bold: true },
      small: { fontSize: 7.5, color: '#57534e' },
      tableHeader: { bold: true, fillColor: '#f5f5f4' },
      caution: { fontSize: 8, color: '#7c2d12' },
      mono: { fontSize: 7.5, characterSpacing: 0.2 },
    },
    header: {
      margin: [40, 20, 40, 0],
      columns: [
        { text: 'Emberline', bold: true, color: '#9a3412' },
        {
          text: `Verification code ${content.verificationCode}`,
          alignment: 'right',
          style: 'small',
        },
      ],
    },
    footer: (page: number, pages: number) => ({
      margin: [40, 8, 40, 0],
      stack: [
        { text: cautions.short, style: 'caution' },
        {
          columns: [
            { text: `${title} · issued ${content.issuedOn}`, style: 'small' },
            { text: `Page ${page} of ${pages}`, alignment: 'right', style: 'small' },
          ],
          margin: [0, 4, 0, 0],
        },
      ],
    }),
    content: [
      { text: title, style: 'title' },
      content.replacesRevision
        ? {
            text: `This revision replaces revision ${content.replacesRevision}, which stays on record.`,
            bold: true,
            color: '#7c2d12',
          }
        : '',
      {
        text: [
          'Check this report at ',
          { text: content.verifyUrl, link: content.verifyUrl, color: '#9a3412' },
          ` (code ${content.verificationCode}).`,
        ],
        margin: [0, 2, 0, 8],
      },
      { text: cautions.dispositions, style: 'caution', margin: [0, 0, 0, 4] },
      { text: cautions.limits, style: 'caution' },
      heading('Engine'),
      keyValues(content.engine.rows),
      heading('Inspection'),
      keyValues(content.inspection.rows),
      heading('Outcome'),
      keyValues([
        ['Decision', content.outcome.decision],
        ...content.outcome.lines.map((line): [string, string] => ['', line]),
        ['Signed by', content.outcome.signedBy],
        ['Next inspection due', content.nextDue],
        ['Damage limits used', content.limitSet],
      ]),
      heading('Coverage'),
      {
        table: {
          headerRows: 1,
          widths: ['*', 70, '*', '*'],
          body: [
            ['Row', 'Viewed', 'Positions', 'Note'].map((text) => ({
              text,
              style: 'tableHeader',
            })),
            ...content.coverage.map((row) => [row.row, row.status, row.viewed, row.note]),
          ],
        },
        layout: 'lightHorizontalLines',
      },
      content.rings.length
        ? {
            columns: content.rings.slice(0, 3).map((ring) => ({
              stack: [
                { image: dataUrl('image/png', ring.png), width: 150 },
                { text: ring.row, style: 'small', alignment: 'center' },
              ],
            })),
            columnGap: 10,
            margin: [0, 10, 0, 0],
          }
        : '',
      ...(content.rings.length > 3
        ? [
            {
              columns: content.rings.slice(3).map((ring) => ({
                stack: [
                  { image: dataUrl('image/png', ring.png), width: 150 },
                  { text: ring.row, style: 'small', alignment: 'center' },
                ],
              })),
              columnGap: 10,
              margin: [0, 10, 0, 0],
            } as Content,
          ]
        : []),
      heading(`Findings (${content.findings.length})`),
      content.findings.length
        ? {
            table: {
              headerRows: 1,
              widths: [16, 46, 18, 38, 34, 62, 42, '*', 22, 52],
              body: [
                [
                  'No.',
                  'Row',
                  'Pos.',
                  'Zone',
                  'Damage',
                  'Measured (mm / in)',
                  'Verdict',
                  'Decision',
                  'Conc.',
                  'Signed by',
                ].map((text) => ({ text, style: 'tableHeader', fontSize: 7.5 })),
                ...content.findings.map((finding) =>
                  [
                    finding.number,
                    finding.row,
                    finding.position,
                    finding.zone,
                    finding.damage,
                    finding.measurement,
                    finding.verdict,
                    finding.decision,
                    finding.concession,
                    finding.signer,
                  ].map((text) => ({ text, fontSize: 7.5 })),
                ),
              ],
            },
            layout: 'lightHorizontalLines',
          }
        : { text: 'No damage was recorded.' },
      ...content.images.flatMap((image): Content[] => [
        {
          stack: [
            {
              image: dataUrl('image/jpeg', image.jpeg),
              fit: [515, 330],
              alignment: 'center',
            },
            { text: image.caption, style: 'small', alignment: 'center', margin: [0, 2, 0, 10] },
          ],
          unbreakable: true,
        },
      ]),
      ...(content.trends.length
        ? [
            ...content.trends.map((trend, index): Content => ({
              // The heading stays with the first chart: never alone at the foot of a page.
              stack: [
                ...(index === 0 ? [heading('Damage trends')] : []),
                { text: trend.caption, bold: true },
                {
                  image: dataUrl('image/png', trend.chart.png),
                  width: 360,
                  margin: [0, 4, 0, 4],
                },
                ...trend.lines.map((line) => ({ text: line, fontSize: 8.5 })),
              ],
              unbreakable: true,
              margin: [0, 0, 0, 10],
            })),
            {
              text: 'A trend is a straight line through past measurements, not a prediction: the approved manual and the engineer decide.',
              style: 'caution',
            },
          ]
        : []),
      heading('Signature records'),
      {
        table: {
          headerRows: 1,
          widths: [55, 100, 75, '*'],
          body: [
            ['Record', 'Signed by', 'Signed at (UTC)', 'SHA-256'].map((text) => ({
              text,
              style: 'tableHeader',
            })),
            ...content.signatures.map((signature) => [
              signature.kind,
              signature.signer,
              signature.signedAt,
              { text: signature.sha256, style: 'mono' },
            ]),
          ],
        },
        layout: 'lightHorizontalLines',
      },
      {
        text: [
          'Signature chain head when this report was issued: ',
          { text: content.chainHead, style: 'mono' },
          '. The release signature, made after this document was rendered, covers its SHA-256.',
        ],
        margin: [0, 6, 0, 0],
        style: 'small',
      },
    ],
  };
}
