import { randomBytes } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { MailMessage } from '@emberline/contracts/outbox';

export interface SmtpFake {
  port: number;
  close(): Promise<void>;
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list
    .flatMap((entry) => entry.value.map((address) => address.address ?? ''))
    .filter(Boolean);
}

async function writeAtomically(file: string, content: string | Buffer): Promise<void> {
  const temp = `${file}.tmp`;
  const handle = await fs.open(temp, 'w');
  try {
    await handle.writeFile(content);
    await handle.sync();
  } finally {
    await handle.close();
  }
  await fs.rename(temp, file);
}

/**
 * A real SMTP server on 127.0.0.1 that keeps every message it receives in `directory`, as the raw
 * `.eml` and a parsed `.json` for the outbox page. It runs by default so that nothing leaves the
 * machine until a real relay is configured. It answers a message only once it is on disk, so a
 * message it acknowledged is kept.
 */
export async function startSmtpFake(directory: string, port = 0): Promise<SmtpFake> {
  await fs.mkdir(directory, { recursive: true });
  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 40 * 1024 * 1024,
    // Like a real relay, refuse what can never be delivered: the reserved .invalid domain
    // (RFC 2606). It lets anyone see how the outbox shows a refused address.
    onRcptTo(address, _session, callback) {
      if (/\.invalid$/i.test(address.address)) {
        const refusal = Object.assign(
          new Error(
            `${address.address}: mailbox unavailable, the .invalid domain receives no mail`,
          ),
          { responseCode: 550 },
        );
        return callback(refusal);
      }
      callback();
    },
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        const id = `${Date.now()}-${randomBytes(4).toString('hex')}`;
        simpleParser(raw)
          .then(async (parsed) => {
            const message: MailMessage = {
              id,
              receivedAt: new Date().toISOString(),
              from: addresses(parsed.from)[0] ?? '',
              to: addresses(parsed.to),
              subject: parsed.subject ?? '',
              attachments: parsed.attachments.length,
              text: parsed.text ?? '',
              attachmentList: parsed.attachments.map((attachment) => ({
                filename: attachment.filename ?? 'attachment',
                contentType: attachment.contentType,
                size: attachment.size,
              })),
            };
            await writeAtomically(path.join(directory, `${id}.eml`), raw);
            await writeAtomically(
              path.join(directory, `${id}.json`),
              JSON.stringify(message, null, 2),
            );
            callback();
          })
          .catch((error: Error) => callback(error));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const boundPort = typeof address === 'object' && address ? address.port : port;
  return {
    port: boundPort,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
