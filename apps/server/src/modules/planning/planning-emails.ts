import { cautions } from '@emberline/contracts/cautions';
import type { DueMove } from '@emberline/contracts/planning';
import { dayWords } from '@emberline/domain/dates';
import { dueWords } from '@emberline/domain/due-status';
import { mailLayout } from '../../lib/email/layout';
import type { MailContent } from '../../lib/email/outbox';

function message(
  input: { to: string[]; link: string },
  subject: string,
  lines: string[],
  label: string,
): MailContent {
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${cautions.dispositions}\n`,
    html: mailLayout(lines, { href: input.link, label }, cautions.dispositions),
  };
}

/** Sent to planners when an engine's due date moves earlier than the day it is booked for. */
export function bookingOverrunEmail(input: {
  to: string[];
  engineSerialNumber: string;
  plannedDate: string;
  move: DueMove;
  link: string;
}): MailContent {
  return message(
    input,
    `Booking now after the due date: engine ${input.engineSerialNumber}`,
    [
      `The next inspection of engine ${input.engineSerialNumber} moved from ${dueWords(input.move.from)} to ${dueWords(input.move.to)}.`,
      `Why: ${input.move.reason}`,
      `It is booked for ${dayWords(input.plannedDate)}, after the new due date. Book it again on or before ${dayWords(input.move.to!.dueDate!)}.`,
    ],
    'Open the engine',
  );
}

/** One engine as a reminder lists it. */
export interface ReminderLine {
  serialNumber: string;
  organisationName: string;
  words: string;
}

/** Sent to planners once a day: what is overdue, due within the margin, to be removed, unbooked. */
export function dailyDigestEmail(input: {
  to: string[];
  day: string;
  sections: { title: string; lines: ReminderLine[] }[];
  link: string;
}): MailContent {
  const lines = [
    `Where the fleet stands on ${dayWords(input.day)}.`,
    ...input.sections.map((section) =>
      [
        `${section.title} (${section.lines.length}):`,
        ...(section.lines.length
          ? section.lines.map(
              (line) => `• ${line.serialNumber} (${line.organisationName}): ${line.words}`,
            )
          : ['• none']),
      ].join('\n'),
    ),
  ];
  const overdue = input.sections[0]?.lines.length ?? 0;
  return message(
    input,
    `Emberline planning, ${dayWords(input.day)}: ${overdue} overdue`,
    lines,
    'Open the planning board',
  );
}

/** Sent to planners the day an engine becomes overdue. */
export function becameOverdueEmail(input: {
  to: string[];
  line: ReminderLine;
  link: string;
}): MailContent {
  return message(
    input,
    `Overdue: engine ${input.line.serialNumber}`,
    [
      `Engine ${input.line.serialNumber} (${input.line.organisationName}) is overdue for inspection: ${input.line.words}`,
      'Book it from today, or take it out of service, as your approved procedures require.',
    ],
    'Open the engine',
  );
}
