import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// The layering rule of server/modules: a module reads and writes the database only through its
// repository (*.repository.ts, functions taking DbOrTx); routers and services hold no SQL.
const MODULES = path.resolve(__dirname, '../../server/modules');

/** The module files that may not touch the database themselves. */
function nonRepositoryFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return nonRepositoryFiles(full);
    return entry.name.endsWith('.ts') && !entry.name.endsWith('.repository.ts') ? [full] : [];
  });
}

const withoutComments = (source: string) =>
  source.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');

const QUERY_CALL = /\.\s*(selectFrom|insertInto|updateTable|deleteFrom)\s*\(/;
/** Kysely's raw `sql` tag, however it is brought in or used. */
const RAW_SQL = /\bimport\s*\{[^}]*\bsql\b[^}]*\}\s*from\s*['"]kysely['"]|\bsql\s*(`|<|\.)/;

/** What in the source breaks the rule, by line. */
function queriesIn(source: string): string[] {
  return withoutComments(source)
    .split('\n')
    .flatMap((line, i) => (QUERY_CALL.test(line) || RAW_SQL.test(line) ? [`${i + 1}: ${line.trim()}`] : []));
}

describe('server modules reach the database only through their repositories', () => {
  it('when a router or service is scanned, then it calls no query builder and no raw sql', () => {
    const files = nonRepositoryFiles(MODULES);
    expect(files.length).toBeGreaterThan(20);
    const offenders = files.flatMap((file) =>
      queriesIn(fs.readFileSync(file, 'utf8')).map((hit) => `${path.relative(MODULES, file)}:${hit}`),
    );
    expect(offenders).toEqual([]);
  });

  it('when the check reads a query, then it reports it, and a comment about one it leaves alone', () => {
    expect(queriesIn("const row = await db.selectFrom('lots').selectAll().execute();")).toHaveLength(1);
    expect(queriesIn("await trx\n  .updateTable('lots')\n  .set({})")).toHaveLength(1);
    expect(queriesIn("import { sql } from 'kysely';")).toHaveLength(1);
    expect(queriesIn("import { sql, type Selectable } from 'kysely';")).toHaveLength(1);
    expect(queriesIn('await sql`select 1`.execute(db);')).toHaveLength(1);
    expect(queriesIn('const n = sql<number>`count(*)`;')).toHaveLength(1);
    expect(queriesIn("// the repository's selectFrom('lots') does this\nconst x = 1;")).toEqual([]);
    expect(
      queriesIn("import type { Selectable } from 'kysely';\nconst url = 'https://example.org/sql';"),
    ).toEqual([]);
  });
});

// Across modules, a module reaches another only through its service (`*.service.ts`) or the
// functions it names as shared (`*.shared.repository.ts`), never its plain repository, router or
// helpers: what a module keeps to itself can change without breaking another.
const MODULE_IMPORT = /from\s+['"](?:\.\.\/|#server\/modules\/)([a-z-]+)\/([\w.-]+)['"]/g;
const SHARED_SURFACE = /\.(service|shared\.repository)$/;

/** The imports of another module's files that are not its service or shared repository. */
function crossModuleImports(module: string, source: string): string[] {
  return [...withoutComments(source).matchAll(MODULE_IMPORT)]
    .filter(([, other, file]) => other !== module && !SHARED_SURFACE.test(file!))
    .map(([, other, file]) => `${other}/${file}`);
}

describe('server modules reach each other only through their services and shared repositories', () => {
  it('when every module file is scanned, then no import reaches into another module', () => {
    const modules = fs.readdirSync(MODULES);
    const offenders = modules.flatMap((module) =>
      allFiles(path.join(MODULES, module)).flatMap((file) =>
        crossModuleImports(module, fs.readFileSync(file, 'utf8')).map(
          (hit) => `${path.relative(MODULES, file)} → ${hit}`,
        ),
      ),
    );
    expect(offenders).toEqual([]);
  });

  it('when the check reads an import, then it tells a shared surface from a module inside', () => {
    expect(crossModuleImports('plan', "import { x } from '../lots/lots.repository';")).toEqual([
      'lots/lots.repository',
    ]);
    expect(crossModuleImports('plan', "import { x } from '#server/modules/lots/lot-code';")).toEqual([
      'lots/lot-code',
    ]);
    expect(crossModuleImports('plan', "import { x } from '../lots/lots.shared.repository';")).toEqual([]);
    expect(crossModuleImports('plan', "import type { S } from '../species/species.service';")).toEqual([]);
    expect(crossModuleImports('plan', "import { y } from '../plan/plan.repository';")).toEqual([]);
  });
});

function allFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return allFiles(full);
    return entry.name.endsWith('.ts') ? [full] : [];
  });
}
