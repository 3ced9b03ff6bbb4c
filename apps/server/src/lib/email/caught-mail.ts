import fs from 'node:fs/promises';
import path from 'node:path';
import type { MailMessage, MailSummary } from '@emberline/contracts/outbox';

const idPattern = /^\d{13}-[a-z0-9]{8}$/;

export interface CaughtMailStore {
  directory: string;
  list(): Promise<MailSummary[]>;
  read(id: string): Promise<MailMessage | null>;
}

/** Reads the messages the local SMTP fake caught: one `.eml` and one `.json` each. */
export function caughtMailStore(directory: string): CaughtMailStore {
  return {
    directory,
    async list() {
      let names: string[];
      try {
        names = await fs.readdir(directory);
      } catch {
        return [];
      }
      const ids = names
        .filter((name) => name.endsWith('.json'))
        .map((name) => name.slice(0, -5))
        .filter((id) => idPattern.test(id))
        .sort()
        .reverse();
      const items = await Promise.all(
        ids.map(async (id) => {
          const message = await this.read(id);
          if (!message) return null;
          const { text: _text, attachmentList: _attachments, ...summary } = message;
          return summary;
        }),
      );
      return items.filter((item): item is MailSummary => item !== null);
    },
    async read(id) {
      if (!idPattern.test(id)) return null;
      try {
        const json = await fs.readFile(path.join(directory, `${id}.json`), 'utf8');
        return JSON.parse(json) as MailMessage;
      } catch {
        return null;
      }
    },
  };
}
