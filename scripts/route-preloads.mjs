// Which script files each page of the web app needs, by URL pattern, for the server to announce
// in index.html (`<link rel="modulepreload">`, api/src/http/static-files.ts).
//   node scripts/route-preloads.mjs [dir]   (default dist/web; reads dir/stats.json, writes
//   dir/browser/route-preloads.json)
// Why: a page's code is a lazy chunk (its feature's routes file, then the page component) that
// imports further chunks; the browser learns each level only once the one above it has arrived,
// and only after main.js has run and the router asked for it. Announced in the HTML, every file
// of the page downloads beside main.js.
// How: reads the route tables of the source (web/src/app/app-routes.ts and the `*-routes.ts`
// files it loads) with the TypeScript parser, follows `path`, `children`, `loadChildren` and
// `loadComponent`, and finds each loaded source file's chunk in the esbuild metafile (by the
// chunk's inputs, else by the name the route takes from it). Routes with a `matcher` or `**` are
// left out (those pages load as before).
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import ts from 'typescript';
import { root } from './lib.mjs';
import { closure, readBuild } from './web-hints.mjs';

const APP_ROUTES = 'web/src/app/app-routes.ts';

function parse(file) {
  return ts.createSourceFile(file, readFileSync(join(root, file), 'utf8'), ts.ScriptTarget.Latest);
}

/** The array literal exported as `name` from `file` (a routes table), or undefined. */
function routesArray(file, name) {
  let found;
  parse(file).forEachChild((node) => {
    if (!ts.isVariableStatement(node)) return;
    for (const d of node.declarationList.declarations)
      if (ts.isIdentifier(d.name) && d.name.text === name && d.initializer)
        found = ts.isArrayLiteralExpression(d.initializer) ? d.initializer : undefined;
  });
  return found;
}

/** `() => import('./x').then((m) => m.Name)`: the source file loaded and the name taken. */
function lazyTarget(file, fn) {
  let spec;
  let name;
  const visit = (node) => {
    if (ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword) {
      const arg = node.arguments[0];
      if (arg && ts.isStringLiteral(arg)) spec = arg.text;
    }
    if (ts.isPropertyAccessExpression(node) && ts.isIdentifier(node.name)) name = node.name.text;
    node.forEachChild(visit);
  };
  visit(fn);
  if (!spec) return undefined;
  return { source: join(dirname(file), spec) + '.ts', name };
}

function property(obj, key) {
  return obj.properties.find(
    (p) => ts.isPropertyAssignment(p) && p.name && ts.isIdentifier(p.name) && p.name.text === key,
  )?.initializer;
}

/**
 * Every page of the routes table exported as `name` from `file`: its full path pattern
 * (`board/rounds/:id`) and the lazy source files loaded on the way there, outermost first.
 */
export function routePages(file = APP_ROUTES, name = 'routes', prefix = [], loads = []) {
  const array = routesArray(file, name);
  return array ? pagesOf(file, array, prefix, loads) : [];
}

function pagesOf(file, array, prefix, loads) {
  const pages = [];
  for (const el of array.elements) {
    if (!ts.isObjectLiteralExpression(el) || property(el, 'matcher')) continue;
    const path = property(el, 'path');
    if (!path || !ts.isStringLiteral(path) || path.text === '**') continue;
    const segments = [...prefix, ...path.text.split('/').filter((s) => s !== '')];
    const here = [...loads];
    const component = property(el, 'loadComponent');
    const target = component && lazyTarget(file, component);
    if (target) here.push(target);
    const children = property(el, 'children');
    const lazyChildren = property(el, 'loadChildren');
    const routesFile = lazyChildren && lazyTarget(file, lazyChildren);
    if (children && ts.isArrayLiteralExpression(children))
      pages.push(...pagesOf(file, children, segments, here));
    else if (routesFile?.name)
      pages.push(
        ...routePages(routesFile.source, routesFile.name, segments, [...here, routesFile]),
      );
    else if (here.length > 0) pages.push({ path: segments.join('/'), loads: here });
  }
  return pages;
}

/** The chunk a lazy `import()` of `source` loads (whose inputs hold it, else exporting `name`). */
function chunkOf(outputs, { source, name }) {
  const rel = relative(root, join(root, source));
  for (const [file, out] of outputs) if (out.inputs.includes(rel)) return file;
  for (const [file, out] of outputs) if (name && out.exports.includes(name)) return file;
  return undefined;
}

/**
 * Writes browser/route-preloads.json: `[{ path, files }]`, the pages in route order, each with
 * the script files it needs beyond those index.html already names.
 */
export function writeRoutePreloads(dir = join(root, 'dist/web')) {
  const build = readBuild(dir);
  if (!build) return { pages: 0, reason: 'no stats.json' };
  const { outputs, html } = build;
  const table = [];
  for (const page of routePages()) {
    const files = new Set();
    for (const load of page.loads) {
      const chunk = chunkOf(outputs, load);
      if (chunk) closure(outputs, chunk, files);
    }
    const needed = [...files].filter((f) => !html.includes(`"${f}"`));
    if (needed.length > 0) table.push({ path: page.path, files: needed });
  }
  writeFileSync(join(dir, 'browser', 'route-preloads.json'), JSON.stringify(table));
  return { pages: table.length };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { pages, reason } = writeRoutePreloads(process.argv[2]);
  console.log(`[ringlet] route-preloads.json: ${pages} pages${reason ? ` (${reason})` : ''}`);
}
