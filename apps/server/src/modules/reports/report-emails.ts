import { cautions } from '@emberline/contracts/cautions';
import type { BeyondAction } from '@emberline/contracts/limits';
import { dayWords } from '@emberline/domain/dates';
import { actionWords } from '@emberline/domain/decision-words';
import { mailLayout } from '../../lib/email/layout';
import type { MailContent } from '../../lib/email/outbox';

/** The signed report, sent to the owner's report contacts when an inspection is released. */
export function reportEmail(input: {
  to: string[];
  engineSerialNumber: string;
  inspectionDate: string;
  revision: number;
  link: string;
  verifyUrl: string;
  filename: string;
  pdf: Buffer;
}): MailContent {
  const lines = [
    `The signed report of the borescope inspection of engine ${input.engineSerialNumber} of ${dayWords(input.inspectionDate)} is attached (revision ${input.revision}).`,
    ...(input.revision > 1
      ? [`It replaces revision ${input.revision - 1}, which stays on record.`]
      : []),
    `Anyone holding it can check that it is genuine and current at ${input.verifyUrl}.`,
    'Your engines, their inspections and their reports are also in your Emberline portal.',
  ];
  return {
    to: input.to,
    subject: `Inspection report: engine ${input.engineSerialNumber}, ${dayWords(input.inspectionDate)}${input.revision > 1 ? ` (revision ${input.revision}, replaces revision ${input.revision - 1})` : ''}`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${cautions.short}\n`,
    html: mailLayout(lines, { href: input.link, label: 'Open the inspection' }, cautions.short),
    attachments: [{ filename: input.filename, contentType: 'application/pdf', content: input.pdf }],
  };
}

/** Sent at once to the owner's contacts for urgent notices: the engine must not fly again as is. */
export function urgentNoticeEmail(input: {
  to: string[];
  engineSerialNumber: string;
  inspectionDate: string;
  removals: BeyondAction[];
  link: string;
}): MailContent {
  const lines = [
    `Urgent: the outcome of the borescope inspection of engine ${input.engineSerialNumber} of ${dayWords(input.inspectionDate)} has been signed and orders its removal:`,
    ...input.removals.map((action) => `${actionWords(action).replace(/^r/, 'R')}.`),
    'The signed report follows when the inspection is released. Contact the inspecting organisation before the engine flies again.',
  ];
  return {
    to: input.to,
    subject: `Urgent: engine ${input.engineSerialNumber} to be removed before its next flight`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${cautions.dispositions}\n`,
    html: mailLayout(lines, { href: input.link, label: 'Open the engine' }, cautions.dispositions),
  };
}
