import { dayWords } from '@emberline/domain/dates';
import { cautions } from '@emberline/contracts/cautions';
import type { BeyondAction } from '@emberline/contracts/limits';
import { actionWords } from '@emberline/domain/decision-words';
import { mailLayout } from '../../lib/email/layout';
import type { MailContent } from '../../lib/email/outbox';

/**
 * The alert the home organisation's reviewers get when an inspection holding a beyond-limits
 * verdict is submitted: the engine may have to come off wing before it flies again.
 */
export function beyondLimitsAlertEmail(input: {
  to: string[];
  engineSerialNumber: string;
  inspectionDate: string;
  submittedBy: string;
  findings: { number: number; where: string; action: BeyondAction | null }[];
  link: string;
}): MailContent {
  const findingLines = input.findings.map(
    (finding) =>
      `F${finding.number}, ${finding.where}: beyond limits${finding.action ? `, ${actionWords(finding.action)}` : ''}.`,
  );
  const lines = [
    `${input.submittedBy} submitted the inspection of engine ${input.engineSerialNumber} of ${dayWords(input.inspectionDate)} for review. It holds ${input.findings.length === 1 ? 'a finding' : `${input.findings.length} findings`} beyond limits:`,
    ...findingLines,
    'Until an authorised engineer dispositions it, the fleet shows this engine as awaiting disposition, beyond limits.',
  ];
  return {
    to: input.to,
    subject: `Beyond limits: engine ${input.engineSerialNumber} awaits disposition`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${cautions.dispositions}\n`,
    html: mailLayout(lines, { href: input.link, label: 'Open the review' }, cautions.dispositions),
  };
}

/**
 * Sent to planners the moment an outcome calling for a removal is signed: the engine has to come
 * off wing, some of it before its next flight.
 */
export function removalOrderedEmail(input: {
  to: string[];
  engineSerialNumber: string;
  inspectionDate: string;
  signedBy: string;
  removals: BeyondAction[];
  link: string;
}): MailContent {
  const lines = [
    `${input.signedBy} signed the outcome of the inspection of engine ${input.engineSerialNumber} of ${dayWords(input.inspectionDate)}. It calls for the engine's removal:`,
    ...input.removals.map((action) => `${actionWords(action).replace(/^r/, 'R')}.`),
    'Plan the removal with the operator; the planning board shows it.',
  ];
  return {
    to: input.to,
    subject: `Removal ordered: engine ${input.engineSerialNumber}`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${cautions.dispositions}\n`,
    html: mailLayout(
      lines,
      { href: input.link, label: 'Open the planning board' },
      cautions.dispositions,
    ),
  };
}
