import fs from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

/**
 * The boundaries of DEVELOPERS.md ("Boundaries") are the linter's, not prose: each fixture breaks
 * one of them (its first line says where it is linted as if it lived, its second what the linter
 * must answer), and `allowed.ts` breaks none.
 */
const root = path.resolve(import.meta.dirname, '../..');
const fixtures = path.join(import.meta.dirname, 'fixtures');
const eslint = new ESLint({ cwd: root });

function fixture(name: string) {
  const code = fs.readFileSync(path.join(fixtures, name), 'utf8');
  const lintAs = /^\/\/ lint as: (\S+)/m.exec(code)?.[1];
  const expected = /^\/\/ expect: (.+)$/m.exec(code)?.[1];
  if (!lintAs || !expected)
    throw new Error(`${name} does not say where to lint it and what to expect`);
  return { code, lintAs, expected };
}

async function lint(name: string) {
  const { code, lintAs, expected } = fixture(name);
  const [result] = await eslint.lintText(code, { filePath: path.join(root, lintAs) });
  return { expected, messages: result!.messages.map((message) => message.message) };
}

const violations = fs.readdirSync(fixtures).filter((name) => name !== 'allowed.ts');

describe('the lint boundaries', () => {
  it.each(violations)('refuses %s', async (name) => {
    const { expected, messages } = await lint(name);
    expect(messages).toEqual([expect.stringContaining(expected)]);
  });

  it('lets a service read through a repository and check access through the helper', async () => {
    const { messages } = await lint('allowed.ts');
    expect(messages).toEqual([]);
  });
});
