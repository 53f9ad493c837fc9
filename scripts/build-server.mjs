// `npm run build:server`: the server as plain JavaScript for production, run by `npm run serve`
// with no TypeScript loader. esbuild bundles our own code (server/, shared/, migrations/, which
// also resolves the package.json "#…" aliases) into build/server/, and leaves every npm package
// external: they load from node_modules as usual. `--outdir DIR` builds elsewhere (tests do).
import path from 'node:path';
import { build } from 'esbuild';
import { root } from './lib/services.mjs';

export async function buildServer(outdir = path.join(root, 'build', 'server')) {
  await build({
    absWorkingDir: root,
    entryPoints: {
      index: 'server/index.ts',
      // `npm run migrate`'s command, and `npm start`'s database preparation (with --no-demo:
      // migrations, the reference species and stored results, no demo season).
      migrate: 'server/db/migrate-cli.ts',
      prepare: 'scripts/db-prepare.ts',
    },
    outdir,
    bundle: true,
    packages: 'external',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: true,
    logLevel: 'warning',
  });
  return {
    index: path.join(outdir, 'index.js'),
    migrate: path.join(outdir, 'migrate.js'),
    prepare: path.join(outdir, 'prepare.js'),
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const at = process.argv.indexOf('--outdir');
  const outdir = at > 0 ? path.resolve(process.argv[at + 1]) : undefined;
  const built = await buildServer(outdir);
  process.stdout.write(`hilum: built the server into ${path.relative(root, path.dirname(built.index))}/\n`);
}
