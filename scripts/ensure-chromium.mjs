// Makes sure Debian's Chromium is there for the end-to-end tests. Playwright cannot download its
// own browser on these machines, so the system package is used instead.
import { execSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
if (existsSync(chromium)) {
  console.log(`Chromium found at ${chromium}`);
  process.exit(0);
}
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
if (!isRoot) {
  console.error(
    `The end-to-end tests need Chromium at ${chromium}, and it is not there.\n` +
      'Install it with:  sudo apt-get update && sudo apt-get install -y chromium\n' +
      'or point CHROMIUM_PATH at a Chromium or Chrome you already have.',
  );
  process.exit(1);
}
console.log('Installing Debian’s chromium package for the end-to-end tests…');
execSync(
  'apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium fonts-dejavu-core',
  {
    stdio: 'inherit',
    shell: '/bin/bash',
  },
);
if (!existsSync(chromium)) {
  console.error(`apt-get finished, but there is still no Chromium at ${chromium}.`);
  process.exit(1);
}
