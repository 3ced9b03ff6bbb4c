// Bundles the server into apps/server/dist/server.js. Workspace packages (pure TypeScript) are
// bundled in; every registry dependency stays external and loads from node_modules.
import { readFileSync } from 'node:fs';
import { build } from 'esbuild';

const pkg = JSON.parse(readFileSync('apps/server/package.json', 'utf8'));
const external = Object.keys(pkg.dependencies).filter((name) => !name.startsWith('@emberline/'));

const started = Date.now();
await build({
  entryPoints: ['apps/server/src/server.ts'],
  outfile: 'apps/server/dist/server.js',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  sourcemap: true,
  external,
  logLevel: 'warning',
});
console.log(`server bundled in ${Date.now() - started} ms`);
