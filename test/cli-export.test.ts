/**
 * `inkroute export` and `inkroute synth --project`, run as a person runs them (spawned
 * through bin/inkroute.js): every format written, each file the same bytes as
 * exportFiles() gives in process, and one clear line with a non-zero exit for bad input,
 * with nothing written.
 */
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { unzipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exportOptions, parseExportArgs, pickSurface } from '../src/cli/export.ts';
import { parseSynthArgs } from '../src/cli/synth.ts';
import { readProjectFile, writeProjectFile } from '../src/doc/projectFile.ts';
import { exampleProjectId, finishedExample } from '../src/example/finished.ts';
import { exportFiles, exportInputFromBundle } from '../src/export/exportFiles.ts';
import { EXPORT_FILES, ExportError, type ExportKind } from '../src/export/types.ts';
import { testSetRecipe } from '../src/synth/index.ts';
import { expectUsageError, inkroute, usage } from './helpers/cli.ts';

const ALL: ExportKind[] = ['svg', 'png', 'letters', 'chart', 'tei', 'annotations'];
const OUT_NAMES: Record<ExportKind, string> = {
  svg: 'f.svg', png: 'f.png', letters: 'l.zip', chart: 'c.svg', tei: 't.xml', annotations: 'a.jsonld',
};

let dir: string;
let projectPath: string;
let bytes: Uint8Array;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'inkroute-export-'));
  // A small test-set inscription: 640×400 px, 10–12 letters, built in ~1.5 s.
  const ex = finishedExample(testSetRecipe()[0]);
  bytes = writeProjectFile({ project: ex.project, images: ex.images });
  projectPath = join(dir, 'example.inkroute');
  writeFileSync(projectPath, bytes);
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A fresh output folder under the test's temporary folder. */
function makeDir(sub: string): void {
  mkdirSync(join(dir, sub), { recursive: true });
}

function outArgs(sub: string, kinds: readonly ExportKind[] = ALL): string[] {
  return kinds.flatMap((k) => [`--${k}`, join(dir, sub, OUT_NAMES[k])]);
}

describe('inkroute export (spawned)', () => {
  it('writes every format, byte for byte what exportFiles gives', () => {
    const sub = 'plain';
    makeDir(sub);
    const r = inkroute('export', projectPath, ...outArgs(sub));
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^export: wrote /);
    const want = exportFiles(exportInputFromBundle(readProjectFile(bytes)), ALL, {});
    expect([...want.keys()]).toEqual(ALL.map((k) => EXPORT_FILES[k]));
    for (const k of ALL) {
      const got = readFileSync(join(dir, sub, OUT_NAMES[k]));
      expect(got.length, k).toBeGreaterThan(0);
      expect(Buffer.from(want.get(EXPORT_FILES[k])!).equals(got), k).toBe(true);
    }
    // The files are what they say. PNG specification §5.2: the 8-byte signature.
    expect([...readFileSync(join(dir, sub, 'f.png')).subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    // ZIP (PKWARE APPNOTE 4.3.7): local file header signature PK\3\4; letters.csv and letters.json inside (naming.md).
    const zip = unzipSync(readFileSync(join(dir, sub, 'l.zip')));
    expect(Object.keys(zip)).toEqual(expect.arrayContaining(['letters.csv', 'letters.json']));
    expect(readFileSync(join(dir, sub, 'f.svg'), 'utf8')).toMatch(/<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    // TEI P5 Guidelines: the root element TEI in the namespace http://www.tei-c.org/ns/1.0.
    expect(readFileSync(join(dir, sub, 't.xml'), 'utf8')).toMatch(/<TEI[^>]*xmlns="http:\/\/www\.tei-c\.org\/ns\/1\.0"/);
    // W3C Web Annotation Data Model §3.1: the context http://www.w3.org/ns/anno.jsonld.
    expect(readFileSync(join(dir, sub, 'a.jsonld'), 'utf8')).toContain('http://www.w3.org/ns/anno.jsonld');
  });

  it('passes the drawing options through, as exportFiles with the same options', () => {
    const sub = 'options';
    makeDir(sub);
    const kinds: ExportKind[] = ['svg', 'png', 'letters'];
    const flags = ['--scale', '2', '--scale-bar', '50', '--restored', 'grey', '--labels', '--line-numbers', '--photo', '--dpi', '150', '--transparent', '--margin', '1', '--surface', 'recto'];
    const r = inkroute('export', projectPath, ...outArgs(sub, kinds), ...flags);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const bundle = readProjectFile(bytes);
    const options = {
      facsimile: { scale: 2, scaleBarMm: 50, restoredStyle: 'grey' as const, labels: true, lineNumbers: true, photoImageId: 'i-visible' },
      png: { scale: 2, scaleBarMm: 50, restoredStyle: 'grey' as const, labels: true, lineNumbers: true, photoImageId: 'i-visible', dpi: 150, background: 'transparent' as const },
      letters: { margin: 1 },
    };
    const want = exportFiles(exportInputFromBundle(bundle, 'recto'), kinds, options);
    for (const k of kinds) expect(Buffer.from(want.get(EXPORT_FILES[k])!).equals(readFileSync(join(dir, sub, OUT_NAMES[k]))), k).toBe(true);
    // The scale bar asked for: exactly 50 mm long in the viewBox's mm, with its label.
    const svgText = readFileSync(join(dir, sub, 'f.svg'), 'utf8');
    expect(svgText).toMatch(/<rect [^>]*width="50"/);
    expect(svgText).toContain('>50 mm</text>');
    // The options differ from the defaults: the SVG is not the plain one.
    expect(readFileSync(join(dir, sub, 'f.svg')).equals(readFileSync(join(dir, 'plain', 'f.svg')))).toBe(false);
  });

  it('a missing file, a file that is not a project, or no output: one line, exit 2, nothing written', () => {
    const sub = 'bad';
    makeDir(sub);
    expectUsageError(inkroute('export', join(dir, 'nosuch.inkroute'), ...outArgs(sub)), /cannot read .*nosuch\.inkroute: no such file/);
    const notZip = join(dir, 'notes.inkroute');
    writeFileSync(notZip, 'plain words, not a zip');
    expectUsageError(inkroute('export', notZip, ...outArgs(sub)), /notes\.inkroute: the project file is damaged or not a zip/);
    expectUsageError(inkroute('export', projectPath), /export needs at least one file to write: --svg FILE, --png FILE/);
    expectUsageError(inkroute('export', projectPath, '--svg', join(dir, sub, 'x.svg'), '--surface', 'verso'), /--surface verso: the project has no such surface \(it has recto\)/);
    expect(readdirSync(join(dir, sub))).toEqual([]);
  });

  it('an export that fails writes none of the asked files, not even those made before it', () => {
    const sub = 'unexportable';
    makeDir(sub);
    // No letters: the transcription can be written (empty), the paleographic chart cannot.
    const bundle = readProjectFile(bytes);
    const bare = join(dir, 'bare.inkroute');
    writeFileSync(bare, writeProjectFile({ project: { ...bundle.project, letters: {} }, images: bundle.images }));
    const input = exportInputFromBundle(readProjectFile(readFileSync(bare)));
    expect(exportFiles(input, ['tei']).size).toBe(1);
    expect(() => exportFiles(input, ['tei', 'chart'])).toThrow(ExportError);
    const r = inkroute('export', bare, ...outArgs(sub, ['tei', 'chart']));
    expectUsageError(r, /^inkroute: cannot export .*bare\.inkroute: there is no letter with strokes to put in the chart$/m);
    expect(readdirSync(join(dir, sub))).toEqual([]);
  });
});

describe('export arguments', () => {
  it('needs an output, and checks numbers and choices before any file is read', () => {
    expect(usage(() => parseExportArgs({}))).toMatch(/^export needs at least one file to write/);
    expect(usage(() => parseExportArgs({ svg: 'a.svg', png: './a.svg' }))).toBe('--svg and --png name the same file ./a.svg');
    expect(usage(() => parseExportArgs({ png: 'a.png', dpi: '0' }))).toBe('--dpi must be above 0, got "0"');
    expect(usage(() => parseExportArgs({ png: 'a.png', dpi: 'lots' }))).toBe('--dpi must be a number, got "lots"');
    expect(usage(() => parseExportArgs({ svg: 'a.svg', dpi: '300' }))).toBe('--dpi applies to the PNG facsimile only: add --png FILE');
    expect(usage(() => parseExportArgs({ svg: 'a.svg', margin: '2' }))).toBe('--margin applies to the letter set only: add --letters FILE');
    expect(usage(() => parseExportArgs({ letters: 'l.zip', margin: '-1' }))).toBe('--margin must be zero or more, got "-1"');
    expect(usage(() => parseExportArgs({ svg: 'a.svg', restored: 'dotted' }))).toBe('--restored must be one of dashed, grey, got "dotted"');
    expect(usage(() => parseExportArgs({ svg: 'a.svg', scale: '-2' }))).toBe('--scale must be above 0, got "-2"');
    expect(usage(() => parseExportArgs({ svg: 'a.svg', scaleBar: '-5' }))).toBe('--scale-bar must be 0 or more, got "-5"');
    expect(parseExportArgs({ svg: 'a.svg', scaleBar: '0' }).scaleBar).toBe(0);
  });
  it('maps --photo to a band of the surface, and --surface to a surface by name', () => {
    const bundle = readProjectFile(bytes);
    expect(pickSurface(bundle, undefined)).toBe('recto');
    expect(pickSurface(bundle, 'recto')).toBe('recto');
    const o = exportOptions(parseExportArgs({ svg: 'a.svg', photo: 'visible' }), bundle, 'recto');
    expect(o.facsimile).toEqual({ photoImageId: 'i-visible' });
    expect(usage(() => exportOptions(parseExportArgs({ svg: 'a.svg', photo: 'infrared' }), bundle, 'recto')))
      .toBe('--photo infrared: the surface has no such band (it has visible)');
  });
  it('exportInputFromBundle keys the images by id and refuses an unknown surface', () => {
    const bundle = readProjectFile(bytes);
    const input = exportInputFromBundle(bundle);
    expect(Object.keys(input.images)).toEqual(['i-visible']);
    expect(input.images['i-visible'].bytes).toBe(bundle.images.get('images/visible.png'));
    expect(() => exportInputFromBundle(bundle, 'verso')).toThrow(ExportError);
  });
});

describe('inkroute synth --project (spawned)', () => {
  it('needs --out or --project', () => {
    expect(() => parseSynthArgs({ seed: '1' })).toThrow('synth needs --out DIR or --project FILE.inkroute');
    expect(parseSynthArgs({ seed: '1', project: 'x.inkroute' })).toMatchObject({ project: 'x.inkroute', out: undefined, seed: 1 });
  });

  it('writes the finished example, and with --if-missing leaves it when it holds the same seed', () => {
    const file = join(dir, 'synth', 'sherd.inkroute');
    const r = inkroute('synth', '--seed', '4101', '--difficulty', 'easy', '--project', file);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/wrote the finished example .* \d+ strokes traced, \d+ letters, 2 doubtful/);
    const bundle = readProjectFile(readFileSync(file));
    expect(bundle.project.id).toBe(exampleProjectId({ seed: 4101, difficulty: 'easy' }));
    expect(Object.keys(bundle.project.letters).length).toBeGreaterThan(10);
    const before = statSync(file).mtimeMs;
    const again = inkroute('synth', '--seed', '4101', '--difficulty', 'easy', '--project', file, '--if-missing');
    expect(again.code).toBe(0);
    expect(again.stdout).toMatch(/already holds seed 4101, left as is/);
    expect(statSync(file).mtimeMs).toBe(before);
    // Another difficulty is another example: made again.
    expect(exampleProjectId({ seed: 4101, difficulty: 'hard' })).not.toBe(bundle.project.id);
    // Written whole through a temporary file: nothing else is left in the folder.
    expect(readdirSync(join(dir, 'synth'))).toEqual(['sherd.inkroute']);
  }, 120_000);
});
