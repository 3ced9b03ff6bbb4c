import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
}

export interface SmtpSettings {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
}

/**
 * The only place that talks SMTP. It sends to a real relay when one is configured and otherwise
 * to the in-process fake, which listens on 127.0.0.1 without TLS.
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
      const info = await transport.sendMail({ from, ...mail });
      return { messageId: info.messageId };
    },
    close() {
      transport.close();
    },
  };
}
