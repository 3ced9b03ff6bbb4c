import { roleLabels, type Role } from '@emberline/contracts/roles';
import { mailLayout as layout } from '../../lib/email/layout';
import type { MailContent } from '../../lib/email/outbox';

export function invitationEmail(input: {
  to: string;
  name: string;
  role: Role;
  organisationName: string;
  invitedBy: string;
  link: string;
}): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `${input.invitedBy} has invited you to Emberline as ${roleLabels[input.role].toLowerCase()} for ${input.organisationName}.`,
    'Open the link below to choose your password. It works once and expires in 7 days.',
  ];
  return {
    to: [input.to],
    subject: 'Your Emberline invitation',
    text: `${lines.join('\n\n')}\n\n${input.link}\n\nIf you did not expect this invitation, you can ignore this message.\n`,
    html: layout(lines, { href: input.link, label: 'Choose your password' }),
  };
}

export function passwordResetEmail(input: { to: string; name: string; link: string }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    'Someone asked to reset the password of your Emberline account. Open the link below to choose a new one. It works once and expires in 1 hour.',
    'If it was not you, ignore this message: your password stays as it is.',
  ];
  return {
    to: [input.to],
    subject: 'Reset your Emberline password',
    text: `${lines.join('\n\n')}\n\n${input.link}\n`,
    html: layout(lines, { href: input.link, label: 'Choose a new password' }),
  };
}
