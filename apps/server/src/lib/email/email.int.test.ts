import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterEach, describe, expect, it } from 'vitest';
import { makeDataDir } from '../../../test/test-app';
import { caughtMailStore } from './caught-mail';
import { createMailer } from './mailer';
import { startSmtpFake, type SmtpFake } from './smtp-fake';

let fake: SmtpFake | null = null;
afterEach(async () => {
  await fake?.close();
  fake = null;
});

describe('e-mail through the local SMTP fake', () => {
  // Reference check (QUALITY §1): the message crosses a real SMTP server implementation
  // (smtp-server) and is parsed back by an independent parser (mailparser).
  it('delivers recipients, subject, text and an attachment, and keeps the raw .eml', async () => {
    const directory = path.join(makeDataDir(), 'mail');
    fake = await startSmtpFake(directory);
    const mailer = createMailer(
      { host: '127.0.0.1', port: fake.port, secure: false },
      'Emberline <no-reply@emberline.invalid>',
    );
    const pdf = Buffer.from('%PDF-1.7\n% a tiny stand-in document\n');
    const result = await mailer.send({
      to: ['ops@corvid.example', 'records@corvid.example'],
      subject: 'Inspection report ESN-DEMO-0001',
      text: 'The signed report is attached.',
      attachments: [{ filename: 'report.pdf', content: pdf, contentType: 'application/pdf' }],
    });
    mailer.close();
    expect(result.accepted).toEqual(['ops@corvid.example', 'records@corvid.example']);
    expect(result.refused).toEqual([]);

    const store = caughtMailStore(directory);
    const [summary] = await store.list();
    expect(summary).toMatchObject({
      to: ['ops@corvid.example', 'records@corvid.example'],
      subject: 'Inspection report ESN-DEMO-0001',
      attachments: 1,
    });

    const raw = await fs.readFile(path.join(directory, `${summary!.id}.eml`));
    const parsed = await simpleParser(raw);
    expect(parsed.text?.trim()).toBe('The signed report is attached.');
    expect(parsed.attachments).toHaveLength(1);
    expect(parsed.attachments[0]?.filename).toBe('report.pdf');
    expect(parsed.attachments[0]?.content.equals(pdf)).toBe(true);
    const leftovers = (await fs.readdir(directory)).filter((name) => name.endsWith('.tmp'));
    expect(leftovers).toEqual([]);
  });

  it('reads no file outside its folder whatever id it is given', async () => {
    const store = caughtMailStore(makeDataDir());
    expect(await store.read('../../etc/passwd')).toBeNull();
    expect(await store.list()).toEqual([]);
  });
});
