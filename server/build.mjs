// Bundles the server for `npm start`: server/index.ts → dist/server/index.js and every
// server/workers/<name>.worker.ts → dist/server/workers/<name>.worker.js. Packages stay external (node_modules).
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const workersDir = path.join(root, 'server/workers');
const workerEntries = fs.existsSync(workersDir)
  ? fs.readdirSync(workersDir).filter((f) => f.endsWith('.worker.ts')).map((f) => path.join(workersDir, f))
  : [];

const common = {
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'info',
  absWorkingDir: root,
};

await build({ ...common, entryPoints: [path.join(root, 'server/index.ts')], outfile: path.join(root, 'dist/server/index.js') });

if (workerEntries.length) {
  await build({
    ...common,
    entryPoints: Object.fromEntries(workerEntries.map((f) => [path.basename(f, '.ts'), f])),
    outdir: path.join(root, 'dist/server/workers'),
  });
}
