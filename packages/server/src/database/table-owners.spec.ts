import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import ts from 'typescript';
import { NOT_YET_MOVED, OWNERSHIP_EXCEPTIONS, TABLE_OWNERS } from './table-owners';

const SRC = join(__dirname, '..');
const SQL_WORDS = /\b(SELECT|INSERT|UPDATE|DELETE|FROM|JOIN|TRUNCATE|TABLE)\b/i;

function files(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? files(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
  );
}

const rel = (f: string) => relative(SRC, f).split(sep).join('/');
const moduleOf = (path: string) => path.split('/')[0]!;
const parse = (f: string) => ts.createSourceFile(f, readFileSync(f, 'utf8'), ts.ScriptTarget.Latest, true);

/** Entity files and the table each maps, from their `@Entity({ name })`. */
function entityTables(): Map<string, string> {
  const out = new Map<string, string>();
  for (const f of files(SRC)) {
    const m = /@Entity\(\{ name: '([a-z_]+)'/.exec(readFileSync(f, 'utf8'));
    if (m) out.set(rel(f).replace(/\.ts$/, ''), m[1]!);
  }
  return out;
}

/** The tables a file names: in SQL text, as a QueryBuilder table name, or through an entity it imports. */
function tablesNamed(f: string, entities: Map<string, string>): Set<string> {
  const tables = Object.keys(TABLE_OWNERS);
  const found = new Set<string>();
  const fileDir = rel(f).split('/').slice(0, -1);
  const visit = (n: ts.Node): void => {
    let text: string | null = null;
    if (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n)) text = n.text;
    else if (ts.isTemplateExpression(n))
      text = [n.head.text, ...n.templateSpans.map((s) => s.literal.text)].join(' ');
    if (text !== null) {
      for (const t of tables) {
        if (text === t && t.includes('_')) found.add(t);
        else if (
          SQL_WORDS.test(text) &&
          (text.includes(`"${t}"`) ||
            new RegExp(`\\b(FROM|JOIN|INTO|UPDATE|TABLE|USING)\\s+${t}\\b`, 'i').test(text))
        )
          found.add(t);
      }
    }
    if (ts.isImportDeclaration(n) && !n.importClause?.isTypeOnly && ts.isStringLiteral(n.moduleSpecifier)) {
      const spec = n.moduleSpecifier.text;
      if (spec.startsWith('.')) {
        const parts = [...fileDir];
        for (const p of spec.split('/')) {
          if (p === '..') parts.pop();
          else if (p !== '.') parts.push(p);
        }
        const table = entities.get(parts.join('/'));
        if (table) found.add(table);
      }
    }
    ts.forEachChild(n, visit);
  };
  visit(parse(f));
  return found;
}

describe('table ownership', () => {
  const entities = entityTables();
  const exempt = (path: string) => OWNERSHIP_EXCEPTIONS.some((e) => path.startsWith(e.path));
  const modules = new Set(
    readdirSync(SRC, { withFileTypes: true })
      .filter((e) => e.isDirectory())
      .map((e) => e.name),
  );

  it('gives every table the migrations create one owning module that exists', () => {
    const created = new Set<string>();
    for (const f of files(join(SRC, 'migrations')))
      for (const m of readFileSync(f, 'utf8').matchAll(/CREATE TABLE (?:IF NOT EXISTS )?"?([a-z_]+)"?/g))
        created.add(m[1]!);
    expect([...created].sort()).toEqual(Object.keys(TABLE_OWNERS).sort());
    for (const owner of Object.values(TABLE_OWNERS)) expect(modules).toContain(owner);
    for (const table of entities.values()) expect(TABLE_OWNERS).toHaveProperty(table);
  });

  it('keeps every entity in the folder of the module that owns its table', () => {
    const misplaced = [...entities].filter(([path, table]) => TABLE_OWNERS[table] !== moduleOf(path));
    expect(misplaced).toEqual([]);
  });

  it('lets no module name a table another module owns', () => {
    const foreign: Record<string, string[]> = {};
    for (const f of files(SRC)) {
      const path = rel(f);
      if (exempt(path) || path.endsWith('.spec.ts')) continue;
      // An entity file may point at another table for its foreign key (schema, not a query).
      const fk = path.includes('/entities/');
      const named = [...tablesNamed(f, entities)].filter(
        (t) => TABLE_OWNERS[t] !== moduleOf(path) && !(fk && path.endsWith('.entity.ts')),
      );
      if (named.length) foreign[path] = named.sort();
    }
    expect(foreign).toEqual(NOT_YET_MOVED);
  });
});
