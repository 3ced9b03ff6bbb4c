import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The repository root, found by walking up from this module. The same code runs from `src/` under
 * tsx and from the bundled `dist/server.js`, which sit at different depths.
 */
function findRepositoryRoot(): string {
  let directory = path.dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (fs.existsSync(path.join(directory, 'pnpm-workspace.yaml'))) return directory;
    const parent = path.dirname(directory);
    if (parent === directory)
      throw new Error('Emberline cannot find its installation folder (pnpm-workspace.yaml)');
    directory = parent;
  }
}

const root = findRepositoryRoot();

export const paths = {
  root,
  migrations: path.join(root, 'apps/server/src/db/migrations'),
  webDist: path.join(root, 'apps/web/dist'),
};
