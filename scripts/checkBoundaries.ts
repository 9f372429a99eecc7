/**
 * Import-boundary check for src/ (run by `npm run lint`, part of `npm test`).
 *
 * Imports flow one way: ui, worker, cli -> io -> dsp (see DEVELOPERS.md, "Layers").
 * The hard rule is the first one: src/dsp imports only src/dsp, `import type` from src/config,
 * and the fft.js package, so the same engine runs in a Web Worker and in Node.
 * Imports are read with the TypeScript parser, so `import type`, `export ... from`,
 * dynamic `import()` and `require()` are all seen.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { builtinModules } from 'node:module';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import ts from 'typescript';

/** One layer's allowed imports. Paths are repository-relative, posix style. */
export interface LayerRule {
  layer: string;
  /** Layers this one may import values and types from (its own layer is implied). */
  mayImport: readonly string[];
  /** Layers (or single modules, without extension) this one may import from with `import type` only. */
  typeOnlyFrom: readonly string[];
  /** Packages allowed; "any" means every non-Node package. */
  packages: readonly string[] | 'any';
  /** Node built-ins (node:fs ...) allowed. */
  nodeBuiltins: boolean;
}

export const layerRules: readonly LayerRule[] = [
  { layer: 'src/dsp', mayImport: [], typeOnlyFrom: ['src/config'], packages: ['fft.js'], nodeBuiltins: false },
  { layer: 'src/config', mayImport: ['src/dsp'], typeOnlyFrom: [], packages: 'any', nodeBuiltins: false },
  { layer: 'src/io', mayImport: ['src/dsp', 'src/config'], typeOnlyFrom: [], packages: 'any', nodeBuiltins: false },
  {
    layer: 'src/worker',
    mayImport: ['src/dsp', 'src/config', 'src/io'],
    typeOnlyFrom: [],
    packages: 'any',
    nodeBuiltins: false,
  },
  { layer: 'src/scenarios', mayImport: [], typeOnlyFrom: ['src/config'], packages: [], nodeBuiltins: false },
  {
    // The main thread runs no DSP: values from src/dsp only for DspError and the standards' numerology
    // tables (plain data, for the form's suggestions); types from anywhere in src/dsp.
    layer: 'src/ui',
    mayImport: [
      'src/worker',
      'src/io',
      'src/config',
      'src/scenarios',
      'src/dsp/errors',
      'src/dsp/numerology/lteNumerology',
      'src/dsp/numerology/nrNumerology',
    ],
    typeOnlyFrom: ['src/dsp'],
    packages: 'any',
    nodeBuiltins: false,
  },
  {
    layer: 'src/cli',
    mayImport: ['src/dsp', 'src/config', 'src/io', 'src/scenarios'],
    typeOnlyFrom: [],
    packages: 'any',
    nodeBuiltins: true,
  },
];

export interface SourceFileText {
  /** Repository-relative posix path, e.g. "src/dsp/ofdm.ts". */
  path: string;
  text: string;
}

export interface BoundaryViolation {
  path: string;
  line: number;
  specifier: string;
  message: string;
}

interface ImportSite {
  specifier: string;
  typeOnly: boolean;
  line: number;
}

const nodeBuiltinNames = new Set(builtinModules);

function isTypeOnlyImport(node: ts.ImportDeclaration): boolean {
  const clause = node.importClause;
  if (clause === undefined) return false; // `import "x"` runs x
  if (clause.isTypeOnly) return true;
  if (clause.name !== undefined) return false;
  const bindings = clause.namedBindings;
  if (bindings === undefined || !ts.isNamedImports(bindings)) return false;
  return bindings.elements.length > 0 && bindings.elements.every((element) => element.isTypeOnly);
}

function isTypeOnlyExport(node: ts.ExportDeclaration): boolean {
  if (node.isTypeOnly) return true;
  const clause = node.exportClause;
  return (
    clause !== undefined &&
    ts.isNamedExports(clause) &&
    clause.elements.length > 0 &&
    clause.elements.every((element) => element.isTypeOnly)
  );
}

/** Every module specifier a file refers to, with whether the reference is erased at compile time. */
export function listImports(file: SourceFileText): ImportSite[] {
  const kind = file.path.endsWith('.tsx') ? ts.ScriptKind.TSX : ts.ScriptKind.TS;
  const source = ts.createSourceFile(file.path, file.text, ts.ScriptTarget.Latest, true, kind);
  const sites: ImportSite[] = [];
  const add = (literal: ts.Node, typeOnly: boolean): void => {
    if (!ts.isStringLiteralLike(literal)) return;
    const line = source.getLineAndCharacterOfPosition(literal.getStart(source)).line + 1;
    sites.push({ specifier: literal.text, typeOnly, line });
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node)) {
      add(node.moduleSpecifier, isTypeOnlyImport(node));
    } else if (ts.isExportDeclaration(node) && node.moduleSpecifier !== undefined) {
      add(node.moduleSpecifier, isTypeOnlyExport(node));
    } else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference)) {
      add(node.moduleReference.expression, node.isTypeOnly);
    } else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument)) {
      add(node.argument.literal, true);
    } else if (ts.isCallExpression(node) && node.arguments.length > 0) {
      const isDynamicImport = node.expression.kind === ts.SyntaxKind.ImportKeyword;
      const isRequire = ts.isIdentifier(node.expression) && node.expression.text === 'require';
      const first = node.arguments[0];
      if ((isDynamicImport || isRequire) && first !== undefined) add(first, false);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return sites;
}

function isInside(target: string, area: string): boolean {
  return target === area || target.startsWith(`${area}/`);
}

function stripExtension(target: string): string {
  return target.replace(/\.(ts|tsx|js|jsx|mjs|cjs|json)$/, '');
}

function ruleFor(filePath: string): LayerRule | undefined {
  return layerRules.find((rule) => isInside(filePath, rule.layer));
}

function checkSite(filePath: string, rule: LayerRule, site: ImportSite): string | undefined {
  const { specifier } = site;
  if (specifier.startsWith('.')) {
    const target = stripExtension(path.posix.normalize(path.posix.join(path.posix.dirname(filePath), specifier)));
    if (isInside(target, rule.layer) || rule.mayImport.some((area) => isInside(target, area))) return undefined;
    if (site.typeOnly && rule.typeOnlyFrom.some((area) => isInside(target, area))) return undefined;
    const typeOnlyNote = rule.typeOnlyFrom.length > 0 ? `; \`import type\` also from ${rule.typeOnlyFrom.join(', ')}` : '';
    const allowed = [rule.layer, ...rule.mayImport].join(', ');
    return `${rule.layer} may import only from ${allowed}${typeOnlyNote}; "${specifier}" resolves to ${target}`;
  }
  const bare = specifier.startsWith('node:') ? specifier.slice(5) : specifier;
  const packageName = bare.startsWith('@') ? bare.split('/').slice(0, 2).join('/') : (bare.split('/')[0] ?? bare);
  if (specifier.startsWith('node:') || nodeBuiltinNames.has(packageName)) {
    return rule.nodeBuiltins ? undefined : `${rule.layer} must not use Node built-ins ("${specifier}"); only src/cli may`;
  }
  if (rule.packages === 'any' || rule.packages.includes(packageName)) return undefined;
  const allowedPackages = rule.packages.length > 0 ? rule.packages.join(', ') : 'no packages';
  return `${rule.layer} may import ${allowedPackages}; "${specifier}" is not allowed`;
}

/** Checks each file under a ruled layer; files outside every layer are not checked. */
export function findBoundaryViolations(files: readonly SourceFileText[]): BoundaryViolation[] {
  const violations: BoundaryViolation[] = [];
  for (const file of files) {
    const rule = ruleFor(file.path);
    if (rule === undefined) continue;
    for (const site of listImports(file)) {
      const message = checkSite(file.path, rule, site);
      if (message !== undefined) violations.push({ path: file.path, line: site.line, specifier: site.specifier, message });
    }
  }
  return violations;
}

function readSourceTree(rootDir: string): SourceFileText[] {
  const srcDir = path.join(rootDir, 'src');
  const entries = readdirSync(srcDir, { recursive: true, encoding: 'utf8' });
  return entries
    .filter((entry) => /\.(ts|tsx)$/.test(entry))
    .sort()
    .map((entry) => {
      const relative = path.posix.join('src', entry.split(path.sep).join('/'));
      return { path: relative, text: readFileSync(path.join(srcDir, entry), 'utf8') };
    });
}

function main(): void {
  const rootDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
  const files = readSourceTree(rootDir);
  const violations = findBoundaryViolations(files);
  for (const v of violations) console.error(`${v.path}:${v.line}: ${v.message}`);
  if (violations.length > 0) {
    console.error(`checkBoundaries: ${violations.length} import(s) cross a layer boundary (rules: scripts/checkBoundaries.ts)`);
    process.exitCode = 1;
    return;
  }
  console.log(`checkBoundaries: ${files.length} files under src/ keep to the layer rules`);
}

const invokedPath = process.argv[1];
if (invokedPath !== undefined && import.meta.url === pathToFileURL(path.resolve(invokedPath)).href) main();
