import type { BeyondAction, FindingEvaluation, Interval } from '@emberline/contracts/limits';
import type { Shape } from '@emberline/contracts/measurement';
import type { Decision, SignatureKind } from '@emberline/contracts/review';

/*
 * What each kind of signature covers (DESIGN §5.5), built by one pure function per kind that the
 * signer and the verifier share: the verifier rebuilds the content from the live rows and compares
 * its hash with the signed one, so a field changed after signing shows. Each builder copies the
 * fields it names and nothing else, so that a field added to a row later does not change the hash
 * of what was signed before it.
 */

/** The previous hash of the first record of a chain. */
export const GENESIS_SHA256 = '0'.repeat(64);

export interface Signer {
  id: string;
  name: string;
  role: string;
  /** The engineer's authorisation reference; null for a kind that needs none. */
  authorisationRef: string | null;
}

/** The part of a signature record its `sha256` covers. */
export interface SignatureHeader {
  seq: number;
  kind: SignatureKind;
  subjectId: string;
  signer: Signer;
  /** UTC, ISO 8601 with milliseconds. */
  signedAt: string;
  meaning: string;
  contentSha256: string;
  prevSha256: string;
}

export function signatureHeader(record: SignatureHeader): SignatureHeader {
  return {
    seq: record.seq,
    kind: record.kind,
    subjectId: record.subjectId,
    signer: {
      id: record.signer.id,
      name: record.signer.name,
      role: record.signer.role,
      authorisationRef: record.signer.authorisationRef,
    },
    signedAt: record.signedAt,
    meaning: record.meaning,
    contentSha256: record.contentSha256,
    prevSha256: record.prevSha256,
  };
}

/** A recorded finding as a disposition covers it: where it is, what it is, how it was measured. */
export interface SignedFinding {
  id: string;
  number: number;
  inspectionId: string;
  imageSha256: string;
  shape: Shape;
  calibration: unknown;
  row: string;
  position: number;
  zone: string;
  damage: string;
  method: string;
  lengthMm: number | null;
  areaMm2: number | null;
  perimeterMm: number | null;
  maxExtentMm: number | null;
  widthMm: number | null;
  depthMm: number | null;
  count: number | null;
  uncertaintyMm: number | null;
  uncertaintyMm2: number | null;
}

export interface DispositionSubject {
  finding: SignedFinding;
  evaluation: Pick<
    FindingEvaluation,
    | 'category'
    | 'measuredCategory'
    | 'indeterminate'
    | 'ruleId'
    | 'reasons'
    | 'repeatInterval'
    | 'beyondAction'
  >;
  decision: Decision;
  rationale: string;
  concession: boolean;
  concessionRef: string | null;
  supersedesId: string | null;
  supersedeReason: string | null;
  /** The engineer's answer when an earlier finding looked like the same damage. */
  recurrence: { candidateFindingId: string; answer: 'same-damage' | 'new-damage' } | null;
  /** The revision the verdict was judged against; null when none was in force. */
  limitSet: { id: string; revision: string; contentSha256: string } | null;
}

const interval = (value: Interval | null) =>
  value && { cycles: value.cycles, hours: value.hours, days: value.days };
const action = (value: BeyondAction | null) =>
  value && { kind: value.kind, cycles: value.cycles, hours: value.hours };

function decision(value: Decision) {
  switch (value.kind) {
    case 'serviceable':
      return { kind: value.kind };
    case 'repeat-inspection':
      return { kind: value.kind, repeatInterval: interval(value.repeatInterval) };
    case 'remove':
      return { kind: value.kind, action: action(value.action) };
  }
}

export function dispositionContent(subject: DispositionSubject) {
  const { finding, evaluation } = subject;
  return {
    finding: {
      id: finding.id,
      number: finding.number,
      inspectionId: finding.inspectionId,
      imageSha256: finding.imageSha256,
      shape: { kind: finding.shape.kind, points: finding.shape.points.map(([x, y]) => [x, y]) },
      calibration: finding.calibration,
      row: finding.row,
      position: finding.position,
      zone: finding.zone,
      damage: finding.damage,
      method: finding.method,
      lengthMm: finding.lengthMm,
      areaMm2: finding.areaMm2,
      perimeterMm: finding.perimeterMm,
      maxExtentMm: finding.maxExtentMm,
      widthMm: finding.widthMm,
      depthMm: finding.depthMm,
      count: finding.count,
      uncertaintyMm: finding.uncertaintyMm,
      uncertaintyMm2: finding.uncertaintyMm2,
    },
    evaluation: {
      category: evaluation.category,
      measuredCategory: evaluation.measuredCategory,
      indeterminate: evaluation.indeterminate,
      ruleId: evaluation.ruleId,
      reasons: [...evaluation.reasons],
      repeatInterval: interval(evaluation.repeatInterval),
      beyondAction: action(evaluation.beyondAction),
    },
    decision: decision(subject.decision),
    rationale: subject.rationale,
    concession: subject.concession,
    concessionRef: subject.concessionRef,
    supersedesId: subject.supersedesId,
    supersedeReason: subject.supersedeReason,
    recurrence: subject.recurrence && {
      candidateFindingId: subject.recurrence.candidateFindingId,
      answer: subject.recurrence.answer,
    },
    limitSet: subject.limitSet && {
      id: subject.limitSet.id,
      revision: subject.limitSet.revision,
      contentSha256: subject.limitSet.contentSha256,
    },
  };
}

export interface WithdrawalSubject {
  inspectionId: string;
  reason: string;
  /** The dispositions withdrawn, each with the hash of its signature. */
  withdrawn: { dispositionId: string; signatureSha256: string }[];
}

export function withdrawalContent(subject: WithdrawalSubject) {
  return {
    inspectionId: subject.inspectionId,
    reason: subject.reason,
    withdrawn: subject.withdrawn.map((item) => ({
      dispositionId: item.dispositionId,
      signatureSha256: item.signatureSha256,
    })),
  };
}

export interface OutcomeSubject {
  inspectionId: string;
  /** The current disposition of every recorded finding, each with the hash of its signature. */
  dispositions: {
    findingId: string;
    dispositionId: string;
    signatureSha256: string;
    decision: Decision;
  }[];
  repeatInterval: Interval | null;
  removals: BeyondAction[];
  flagAcceptances: { code: string; note: string }[];
}

export function outcomeContent(subject: OutcomeSubject) {
  return {
    inspectionId: subject.inspectionId,
    dispositions: subject.dispositions.map((item) => ({
      findingId: item.findingId,
      dispositionId: item.dispositionId,
      signatureSha256: item.signatureSha256,
      decision: decision(item.decision),
    })),
    repeatInterval: interval(subject.repeatInterval),
    removals: subject.removals.map((item) => action(item)),
    flagAcceptances: subject.flagAcceptances.map((item) => ({ code: item.code, note: item.note })),
  };
}

export interface PublicationSubject {
  limitSetId: string;
  modelId: string;
  revision: string;
  /** The hash of the revision's particulars and rules as published. */
  contentSha256: string;
}

export function publicationContent(subject: PublicationSubject) {
  return {
    limitSetId: subject.limitSetId,
    modelId: subject.modelId,
    revision: subject.revision,
    contentSha256: subject.contentSha256,
  };
}

/** A limit revision's independent check covers its content hash as checked. */
export function limitCheckContent(subject: PublicationSubject) {
  return {
    limitSetId: subject.limitSetId,
    modelId: subject.modelId,
    revision: subject.revision,
    contentSha256: subject.contentSha256,
  };
}

export interface ReleaseSubject {
  inspectionId: string;
  outcomeSignatureSha256: string;
  /** The report's hash and revision, once reports are issued with the release. */
  report: { pdfSha256: string; revision: number } | null;
}

export function releaseContent(subject: ReleaseSubject) {
  return {
    inspectionId: subject.inspectionId,
    outcomeSignatureSha256: subject.outcomeSignatureSha256,
    report: subject.report && {
      pdfSha256: subject.report.pdfSha256,
      revision: subject.report.revision,
    },
  };
}
