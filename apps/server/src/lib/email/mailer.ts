import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

/** What the SMTP server did with each recipient of one message. */
export interface SendResult {
  messageId: string | null;
  accepted: string[];
  /** Refused for good (5xx): the address needs a person. */
  refused: { address: string; error: string }[];
  /** Put off for now (4xx): worth another attempt. */
  deferred: { address: string; error: string }[];
}

export interface Mailer {
  /** Sends one message; throws when it could not be handed over at all (server down, timeout). */
  send(mail: OutgoingMail): Promise<SendResult>;
  close(): void;
}

interface RecipientError {
  recipient?: string;
  responseCode?: number;
  response?: string;
  message?: string;
}

function byAnswer(errors: RecipientError[] | undefined): Pick<SendResult, 'refused' | 'deferred'> {
  const refused: SendResult['refused'] = [];
  const deferred: SendResult['deferred'] = [];
  for (const error of errors ?? []) {
    const item = {
      address: error.recipient ?? '',
      error: error.response ?? error.message ?? 'refused',
    };
    if ((error.responseCode ?? 500) >= 500) refused.push(item);
    else deferred.push(item);
  }
  return { refused, deferred };
}

const addressOf = (entry: string | { address: string }) =>
  typeof entry === 'string' ? entry : entry.address;

export interface SmtpSettings {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
}

/**
 * The only place that talks SMTP (through nodemailer), used by the outbox's delivery worker alone:
 * modules queue messages with `queueMail`. It sends to a real relay when one is configured and
 * otherwise to the in-process fake, which listens on 127.0.0.1 without TLS.
 */
export function createMailer(settings: SmtpSettings, from: string): Mailer {
  const local = settings.host === '127.0.0.1';
  const transport = nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    ignoreTLS: local,
    auth: settings.user ? { user: settings.user, pass: settings.password ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(mail) {
      try {
        const info = await transport.sendMail({ from, ...mail });
        return {
          messageId: info.messageId,
          accepted: info.accepted.map(addressOf),
          ...byAnswer((info as { rejectedErrors?: RecipientError[] }).rejectedErrors),
        };
      } catch (error) {
        // Every recipient refused: an answer about the addresses, not a failure of the server.
        const envelope = error as { code?: string; rejectedErrors?: RecipientError[] };
        if (envelope.code === 'EENVELOPE' && envelope.rejectedErrors?.length)
          return { messageId: null, accepted: [], ...byAnswer(envelope.rejectedErrors) };
        throw error;
      }
    },
    close() {
      transport.close();
    },
  };
}
