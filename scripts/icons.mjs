// The icon font the web app ships: only the Material Symbols (outlined) icons that web/src uses,
// cut from the `material-symbols` package's 4 MB font with HarfBuzz (the `subset-font` package,
// WebAssembly, nothing downloaded), at weight 400 / fill 0 / grade 0 / optical size 24.
//   node scripts/icons.mjs          writes web/src/fonts/material-symbols-outlined-subset.woff2
//   node scripts/icons.mjs --check  exits 1 naming each used icon that the shipped font lacks
//                                   (--web DIR: the sources in DIR instead of web/src)
// `npm run build:web` (and the builds of npm start / npm test) write it before `ng build`; the
// file is committed, so a plain `ng build` works too, and api/src/http/icon-font.spec.ts fails
// when an icon is used that the committed font does not draw.
//
// An icon counts as used when its ligature name is the literal text of a <mat-icon> (templates
// in .html and inline in .ts), the value of an `icon:` property, or any quoted string in a .ts
// file that shows icons (mentions mat-icon or MatIcon) — as long as the name is a Material Symbol.
//
// Why not simply subset by the names' letters: HarfBuzz keeps every ligature whose letters are
// kept, i.e. all 3,000+ icons. So the subset is asked for the icons' own code points (each icon
// also has one), with the layout closure off; the ligature table then keeps only the ligatures
// whose glyphs were kept.
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, relative } from 'node:path';
import { root } from './lib.mjs';

const require = createRequire(import.meta.url);
const SOURCE = require.resolve('material-symbols/material-symbols-outlined.woff2');
export const ICON_FONT = join(root, 'web/src/fonts/material-symbols-outlined-subset.woff2');
const AXES = { FILL: 0, wght: 400, GRAD: 0, opsz: 24 };

/** Every Material Symbols name (the package's own list). */
function symbolNames() {
  const dts = readFileSync(require.resolve('material-symbols/index.d.ts'), 'utf8');
  return new Set([...dts.matchAll(/^\s*"([a-z0-9_]+)",?$/gm)].map((m) => m[1]));
}

function sourceFiles(dir, out = []) {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    if (entry.isDirectory()) sourceFiles(p, out);
    else if (/\.(ts|html)$/.test(entry.name) && !/\.spec\.ts$/.test(entry.name)) out.push(p);
  }
  return out;
}

/** The icon names web/src uses, sorted, each with the first file it was found in. */
export function usedIcons(webSrc = join(root, 'web/src')) {
  const names = symbolNames();
  const found = new Map();
  const add = (name, file) => {
    if (names.has(name) && !found.has(name)) found.set(name, relative(root, file));
  };
  for (const file of sourceFiles(webSrc)) {
    const text = readFileSync(file, 'utf8');
    for (const m of text.matchAll(/<mat-icon\b[^>]*>\s*([a-z0-9_]+)\s*<\/mat-icon>/g))
      add(m[1], file);
    for (const m of text.matchAll(/\bicon\s*:\s*['"`]([a-z0-9_]+)['"`]/g)) add(m[1], file);
    if (file.endsWith('.ts') && /mat-icon|MatIcon/.test(text))
      for (const m of text.matchAll(/['"`]([a-z0-9_]+)['"`]/g)) add(m[1], file);
  }
  return new Map([...found].sort(([a], [b]) => a.localeCompare(b)));
}

async function harfbuzzFont(bytes) {
  const { convert } = require('fontverter');
  const hb = await import('harfbuzzjs');
  const sfnt = await convert(Buffer.from(bytes), 'sfnt');
  const face = new hb.Face(new hb.Blob(sfnt));
  const font = new hb.Font(face);
  /** The single glyph the ligature `name` becomes, or undefined when it stays letters. */
  const ligature = (name) => {
    const buffer = new hb.Buffer();
    buffer.addText(name);
    buffer.guessSegmentProperties();
    hb.shape(font, buffer);
    const glyphs = buffer.getGlyphInfos();
    return glyphs.length === 1 && glyphs[0].codepoint !== 0 ? glyphs[0].codepoint : undefined;
  };
  return { hb, face, font, ligature };
}

/** The used names the font at `path` does not turn into one glyph. */
export async function missingIcons(path = ICON_FONT, used = usedIcons()) {
  const { ligature } = await harfbuzzFont(readFileSync(path));
  return [...used.keys()].filter((name) => ligature(name) === undefined);
}

/** Writes the subset font; returns its size and the icons in it. */
export async function subsetIcons(used = usedIcons()) {
  const subsetFont = require('subset-font');
  const source = readFileSync(SOURCE);
  const { face, font, ligature } = await harfbuzzFont(source);
  const codepointOf = new Map();
  for (const u of face.collectUnicodes()) {
    const gid = font.nominalGlyph(u);
    if (gid !== undefined && !codepointOf.has(gid)) codepointOf.set(gid, u);
  }
  const chars = new Set();
  for (const name of used.keys()) {
    const gid = ligature(name);
    const cp = gid === undefined ? undefined : codepointOf.get(gid);
    if (cp === undefined) throw new Error(`icon "${name}" has no glyph of its own in ${SOURCE}`);
    chars.add(String.fromCodePoint(cp));
    for (const c of name) chars.add(c);
  }
  const bytes = await subsetFont(source, [...chars].sort().join(''), {
    targetFormat: 'woff2',
    noLayoutClosure: true,
    variationAxes: AXES,
  });
  // Rewritten only when it changes, so the web build's staleness check is not fooled.
  if (!existsSync(ICON_FONT) || !readFileSync(ICON_FONT).equals(bytes))
    writeFileSync(ICON_FONT, bytes);
  return { bytes: bytes.length, icons: [...used.keys()] };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  if (process.argv.includes('--check')) {
    // --web DIR checks another source folder (the spec uses it to see the check fail).
    const web = process.argv.indexOf('--web');
    const used = web > 0 ? usedIcons(process.argv[web + 1]) : usedIcons();
    const missing = await missingIcons(ICON_FONT, used);
    for (const name of missing)
      console.error(`icon "${name}" (${used.get(name)}) is not in ${relative(root, ICON_FONT)}`);
    if (missing.length) {
      console.error('run `node scripts/icons.mjs` to cut the font again');
      process.exit(1);
    }
    console.log(`[ringlet] icon font has all ${used.size} icons used`);
  } else {
    const { bytes, icons } = await subsetIcons();
    console.log(
      `[ringlet] icon font: ${icons.length} icons, ${(bytes / 1024).toFixed(1)} kB (${relative(root, ICON_FONT)})`,
    );
  }
}
