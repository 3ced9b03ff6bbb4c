import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalSha256 } from '../../apps/server/src/lib/canonical';
import {
  dispositionContent,
  GENESIS_SHA256,
  outcomeContent,
  publicationContent,
  releaseContent,
  signatureHeader,
  withdrawalContent,
  type DispositionSubject,
} from '../../packages/domain/src/signature-content';

// A hand-made, invented disposition: every value below is made up for this check.
const subject: DispositionSubject = {
  finding: {
    id: 'finding-1',
    number: 3,
    inspectionId: 'inspection-1',
    imageSha256: 'a'.repeat(64),
    shape: {
      kind: 'polyline',
      points: [
        [10, 20],
        [30, 40],
      ],
    },
    calibration: { kind: 'reference', p1: [0, 0], p2: [100, 0], lengthMm: 10 },
    row: 'hpt1-blade',
    position: 7,
    zone: 'leading-edge',
    damage: 'crack',
    method: 'image',
    lengthMm: 2.5,
    areaMm2: null,
    perimeterMm: null,
    maxExtentMm: null,
    widthMm: null,
    depthMm: null,
    count: null,
    uncertaintyMm: 0.125,
    uncertaintyMm2: null,
  },
  evaluation: {
    category: 'repeat-inspection',
    measuredCategory: 'repeat-inspection',
    indeterminate: false,
    ruleId: 'R1',
    reasons: ['within-repeat'],
    repeatInterval: { cycles: 400, hours: null, days: null },
    beyondAction: null,
  },
  decision: { kind: 'repeat-inspection', repeatInterval: { cycles: 400, hours: null, days: null } },
  rationale: 'Within the repeat band.',
  concession: false,
  concessionRef: null,
  supersedesId: null,
  supersedeReason: null,
  recurrence: { candidateFindingId: 'finding-0', answer: 'same-damage' },
  limitSet: { id: 'limit-set-1', revision: 'X-1', contentSha256: 'b'.repeat(64) },
};

describe('the signed content of a disposition (DESIGN §5.5)', () => {
  it('is the canonical text below, whose SHA-256 an independent tool gives', () => {
    const content = dispositionContent({
      ...subject,
      // A field the builder does not name never reaches the signed content.
      finding: { ...subject.finding, notes: 'not signed' } as DispositionSubject['finding'],
    });
    const text = canonicalJson(content);
    expect(text).toBe(EXPECTED_TEXT);
    // Computed with GNU coreutils: printf '%s' "$EXPECTED_TEXT" | sha256sum
    expect(canonicalSha256(content)).toBe(EXPECTED_SHA256);
  });

  it('chains its header: the first record follows 64 zeros', () => {
    const header = signatureHeader({
      seq: 1,
      kind: 'disposition',
      subjectId: 'disposition-1',
      signer: {
        id: 'user-1',
        name: 'Invented Engineer',
        role: 'engineer',
        authorisationRef: 'AUTH-1',
      },
      signedAt: '2026-12-03T10:00:00.000Z',
      meaning: 'I decide.',
      contentSha256: EXPECTED_SHA256,
      prevSha256: GENESIS_SHA256,
    });
    expect(canonicalJson(header)).toBe(EXPECTED_HEADER);
    // Computed with GNU coreutils: printf '%s' "$EXPECTED_HEADER" | sha256sum
    expect(canonicalSha256(header)).toBe(EXPECTED_HEADER_SHA256);
  });
});

// The other kinds, each from a hand-made, invented record; every hash computed with GNU coreutils
// as printf '%s' "<the text beside it>" | sha256sum.
describe('the signed content of every other kind (DESIGN §5.5)', () => {
  const cases = [
    {
      kind: 'withdrawal',
      content: withdrawalContent({
        inspectionId: 'inspection-1',
        reason: 'Measure F3 again on a sharper still',
        withdrawn: [{ dispositionId: 'disposition-1', signatureSha256: 'c'.repeat(64) }],
      }),
      text: '{"inspectionId":"inspection-1","reason":"Measure F3 again on a sharper still","withdrawn":[{"dispositionId":"disposition-1","signatureSha256":"cccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccc"}]}',
      sha256: 'bc0a5befea3b31e656973b88d066f4c003c5573eb5b0becf842073bffb728bc5',
    },
    {
      kind: 'outcome',
      content: outcomeContent({
        inspectionId: 'inspection-1',
        dispositions: [
          {
            findingId: 'finding-2',
            dispositionId: 'disposition-2',
            signatureSha256: 'd'.repeat(64),
            decision: {
              kind: 'remove',
              action: { kind: 'remove-within', cycles: 50, hours: null },
            },
          },
        ],
        repeatInterval: null,
        removals: [{ kind: 'remove-within', cycles: 50, hours: null }],
        flagAcceptances: [
          { code: 'probe-calibration-expired', note: 'Cross-checked on the reference still' },
        ],
      }),
      text: '{"dispositions":[{"decision":{"action":{"cycles":50,"hours":null,"kind":"remove-within"},"kind":"remove"},"dispositionId":"disposition-2","findingId":"finding-2","signatureSha256":"dddddddddddddddddddddddddddddddddddddddddddddddddddddddddddddddd"}],"flagAcceptances":[{"code":"probe-calibration-expired","note":"Cross-checked on the reference still"}],"inspectionId":"inspection-1","removals":[{"cycles":50,"hours":null,"kind":"remove-within"}],"repeatInterval":null}',
      sha256: '24a6c1bc756a843776e8d649c631bf14206f7293e925cfab71ff993ffd16de82',
    },
    {
      kind: 'release',
      content: releaseContent({
        inspectionId: 'inspection-1',
        outcomeSignatureSha256: 'e'.repeat(64),
        report: null,
      }),
      text: '{"inspectionId":"inspection-1","outcomeSignatureSha256":"eeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeeee","report":null}',
      sha256: 'e4219523196450fec40474454b2e145ef308bfaab6fca768604b082db6beee45',
    },
    {
      kind: 'publication',
      content: publicationContent({
        limitSetId: 'limit-set-2',
        modelId: 'model-1',
        revision: 'X-2',
        contentSha256: 'f'.repeat(64),
      }),
      text: '{"contentSha256":"ffffffffffffffffffffffffffffffffffffffffffffffffffffffffffffffff","limitSetId":"limit-set-2","modelId":"model-1","revision":"X-2"}',
      sha256: 'eb3885aa6a5f447adff29845d769f8b187e86a287aa21c05ff7e2b7840da2db2',
    },
  ];
  for (const item of cases)
    it(`builds a ${item.kind} as the canonical text whose SHA-256 an independent tool gives`, () => {
      expect(canonicalJson(item.content)).toBe(item.text);
      expect(canonicalSha256(item.content)).toBe(item.sha256);
    });
});

const EXPECTED_TEXT =
  '{"concession":false,"concessionRef":null,"decision":{"kind":"repeat-inspection","repeatInterval":{"cycles":400,"days":null,"hours":null}},"evaluation":{"beyondAction":null,"category":"repeat-inspection","indeterminate":false,"measuredCategory":"repeat-inspection","reasons":["within-repeat"],"repeatInterval":{"cycles":400,"days":null,"hours":null},"ruleId":"R1"},"finding":{"areaMm2":null,"calibration":{"kind":"reference","lengthMm":10,"p1":[0,0],"p2":[100,0]},"count":null,"damage":"crack","depthMm":null,"id":"finding-1","imageSha256":"aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa","inspectionId":"inspection-1","lengthMm":2.5,"maxExtentMm":null,"method":"image","number":3,"perimeterMm":null,"position":7,"row":"hpt1-blade","shape":{"kind":"polyline","points":[[10,20],[30,40]]},"uncertaintyMm":0.125,"uncertaintyMm2":null,"widthMm":null,"zone":"leading-edge"},"limitSet":{"contentSha256":"bbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbbb","id":"limit-set-1","revision":"X-1"},"rationale":"Within the repeat band.","recurrence":{"answer":"same-damage","candidateFindingId":"finding-0"},"supersedeReason":null,"supersedesId":null}';
const EXPECTED_SHA256 = 'f1884cc21e26d69b495c6706e3922e4f49e1145a4753d8bbc683312664e0a3f4';
const EXPECTED_HEADER =
  '{"contentSha256":"f1884cc21e26d69b495c6706e3922e4f49e1145a4753d8bbc683312664e0a3f4","kind":"disposition","meaning":"I decide.","prevSha256":"0000000000000000000000000000000000000000000000000000000000000000","seq":1,"signedAt":"2026-12-03T10:00:00.000Z","signer":{"authorisationRef":"AUTH-1","id":"user-1","name":"Invented Engineer","role":"engineer"},"subjectId":"disposition-1"}';
const EXPECTED_HEADER_SHA256 = '5a1ac2a6243952d95f3f52fecbb5a85320146d77993e8c85d8020568edc41888';
