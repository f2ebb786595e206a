/**
 * `inkroute export PROJECT.inkroute --svg F --png F --letters F.zip --chart F.svg --tei F
 * --annotations F`: writes the asked exports of a project. Every file is made in memory
 * first and written only when all of them were made, so a failure leaves nothing half
 * written; the files are the bytes exportFiles gives the editor too.
 */
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { ProjectBundle } from '../doc/projectFile.ts';
import { EXPORT_FILES, type ExportKind } from '../export/types.ts';
import type { ExportOptions } from '../export/exportFiles.ts';
import { parseNumber } from './args.ts';
import { UsageError } from './errors.ts';
import { readInput, writeFailure } from './files.ts';

/** Options of `inkroute export` as commander hands them over. */
export interface ExportArgs {
  svg?: string;
  png?: string;
  letters?: string;
  chart?: string;
  tei?: string;
  annotations?: string;
  dpi?: string;
  transparent?: boolean;
  scale?: string;
  scaleBar?: string;
  restored?: string;
  labels?: boolean;
  lineNumbers?: boolean;
  /** true: the first band; a string: the band's name. */
  photo?: boolean | string;
  margin?: string;
  surface?: string;
}

/** The option of each export kind, in the order they are made and reported. */
const OUTPUT_OPTIONS: readonly ExportKind[] = ['svg', 'png', 'letters', 'chart', 'tei', 'annotations'];

export interface ExportPlan {
  /** Export kind → the file to write it to. */
  outputs: Map<ExportKind, string>;
  scale?: number;
  /** Scale bar length, mm; 0 for none; undefined for the default. */
  scaleBar?: number;
  restored?: 'dashed' | 'grey';
  labels: boolean;
  lineNumbers: boolean;
  /** undefined: no photo; true: the surface's first band; a string: the band's name. */
  photo?: true | string;
  dpi?: number;
  transparent: boolean;
  margin?: number;
  surface?: string;
}

function positive(text: string, what: string): number {
  const v = parseNumber(text, what);
  if (!(v > 0)) throw new UsageError(`${what} must be above 0, got "${text}"`);
  return v;
}

function notNegative(text: string, what: string): number {
  const v = parseNumber(text, what);
  if (!(v >= 0)) throw new UsageError(`${what} must be 0 or more, got "${text}"`);
  return v;
}

/** Parses and checks everything that does not need the project. */
export function parseExportArgs(args: ExportArgs): ExportPlan {
  const outputs = new Map<ExportKind, string>();
  const seen = new Map<string, ExportKind>();
  for (const kind of OUTPUT_OPTIONS) {
    const file = args[kind];
    if (file === undefined) continue;
    if (file.trim() === '') throw new UsageError(`--${kind} needs a file name`);
    const other = seen.get(resolve(file));
    if (other) throw new UsageError(`--${other} and --${kind} name the same file ${file}`);
    seen.set(resolve(file), kind);
    outputs.set(kind, file);
  }
  if (outputs.size === 0) {
    throw new UsageError(`export needs at least one file to write: ${OUTPUT_OPTIONS.map((k) => `--${k} FILE`).join(', ')}`);
  }
  if (args.dpi !== undefined && !outputs.has('png')) throw new UsageError('--dpi applies to the PNG facsimile only: add --png FILE');
  if (args.transparent && !outputs.has('png')) throw new UsageError('--transparent applies to the PNG facsimile only: add --png FILE');
  if (args.margin !== undefined && !outputs.has('letters')) throw new UsageError('--margin applies to the letter set only: add --letters FILE');
  let margin: number | undefined;
  if (args.margin !== undefined) {
    margin = parseNumber(args.margin, '--margin');
    if (margin < 0) throw new UsageError(`--margin must be zero or more, got "${args.margin}"`);
  }
  let restored: ExportPlan['restored'];
  if (args.restored !== undefined) {
    if (args.restored !== 'dashed' && args.restored !== 'grey') throw new UsageError(`--restored must be one of dashed, grey, got "${args.restored}"`);
    restored = args.restored;
  }
  if (typeof args.photo === 'string' && args.photo.trim() === '') throw new UsageError('--photo needs a band name, or nothing for the first band');
  return {
    outputs,
    scale: args.scale === undefined ? undefined : positive(args.scale, '--scale'),
    scaleBar: args.scaleBar === undefined ? undefined : notNegative(args.scaleBar, '--scale-bar'),
    restored,
    labels: Boolean(args.labels),
    lineNumbers: Boolean(args.lineNumbers),
    photo: args.photo === undefined || args.photo === false ? undefined : args.photo,
    dpi: args.dpi === undefined ? undefined : positive(args.dpi, '--dpi'),
    transparent: Boolean(args.transparent),
    margin,
    surface: args.surface,
  };
}

/** The surface id of --surface (a surface's name, or its id); the first surface when not given. */
export function pickSurface(bundle: ProjectBundle, name: string | undefined): string {
  const surfaces = bundle.project.surfaces;
  if (name === undefined) return surfaces[0].id;
  const hit = surfaces.find((s) => s.name === name) ?? surfaces.find((s) => s.id === name);
  if (!hit) throw new UsageError(`--surface ${name}: the project has no such surface (it has ${surfaces.map((s) => s.name || s.id).join(', ')})`);
  return hit.id;
}

/** The options each exporter gets from the plan, for the chosen surface. */
export function exportOptions(plan: ExportPlan, bundle: ProjectBundle, surfaceId: string): ExportOptions {
  const facsimile: ExportOptions['facsimile'] = {};
  if (plan.scale !== undefined) facsimile.scale = plan.scale;
  if (plan.scaleBar !== undefined) facsimile.scaleBarMm = plan.scaleBar;
  if (plan.restored !== undefined) facsimile.restoredStyle = plan.restored;
  if (plan.labels) facsimile.labels = true;
  if (plan.lineNumbers) facsimile.lineNumbers = true;
  if (plan.photo !== undefined) {
    const images = bundle.project.surfaces.find((s) => s.id === surfaceId)!.images;
    const image = plan.photo === true ? images[0] : images.find((i) => i.band === plan.photo);
    if (!image) throw new UsageError(`--photo ${plan.photo}: the surface has no such band (it has ${images.map((i) => i.band).join(', ')})`);
    facsimile.photoImageId = image.id;
  }
  const png: ExportOptions['png'] = { ...facsimile };
  if (plan.dpi !== undefined) png.dpi = plan.dpi;
  if (plan.transparent) png.background = 'transparent';
  return { facsimile, png, letters: plan.margin === undefined ? {} : { margin: plan.margin } };
}

/** Writes every file, or none: all go to temporary names first and are renamed at the end. */
function writeAll(files: readonly [path: string, data: Uint8Array][]): void {
  const temps: string[] = [];
  try {
    for (const [path, data] of files) {
      const tmp = `${path}.${process.pid}.tmp`;
      try {
        writeFileSync(tmp, data);
      } catch (e) {
        throw writeFailure(path, e);
      }
      temps.push(tmp);
    }
  } catch (e) {
    for (const t of temps) rmSync(t, { force: true });
    throw e;
  }
  files.forEach(([path], i) => {
    try {
      renameSync(temps[i], path);
    } catch (e) {
      for (const t of temps.slice(i)) rmSync(t, { force: true });
      throw writeFailure(path, e);
    }
  });
}

/** A message as the tail of our line: no final full stop, a leading capital lowered unless it starts an acronym. */
function sentencePart(message: string): string {
  const m = message.replace(/\.$/, '');
  return /^[A-Z][a-z]/.test(m) ? m[0].toLowerCase() + m.slice(1) : m;
}

export async function runExport(projectPath: string, args: ExportArgs): Promise<void> {
  const plan = parseExportArgs(args);
  const bytes = readInput(projectPath);
  // Loaded only now: a bad request fails fast, without loading the exporters.
  const { readProjectFile } = await import('../doc/projectFile.ts');
  const { ProjectFormatError } = await import('../doc/schema.ts');
  const { exportFiles, exportInputFromBundle } = await import('../export/exportFiles.ts');
  const { ExportError } = await import('../export/types.ts');
  let bundle: ProjectBundle;
  try {
    bundle = readProjectFile(bytes);
  } catch (e) {
    if (e instanceof ProjectFormatError) throw new UsageError(`${projectPath}: ${sentencePart(e.message)}`);
    throw e;
  }
  const surfaceId = pickSurface(bundle, plan.surface);
  const options = exportOptions(plan, bundle, surfaceId);
  const t0 = performance.now();
  let made: Map<string, Uint8Array>;
  try {
    made = exportFiles(exportInputFromBundle(bundle, surfaceId), [...plan.outputs.keys()], options);
  } catch (e) {
    if (e instanceof ExportError) throw new UsageError(`cannot export ${projectPath}: ${sentencePart(e.message)}`);
    throw e;
  }
  const files = [...plan.outputs].map(([kind, path]) => [path, made.get(EXPORT_FILES[kind])!] as [string, Uint8Array]);
  writeAll(files);
  process.stdout.write(
    `export: wrote ${files.map(([path, data]) => `${path} (${data.length} bytes)`).join(', ')} ` +
      `in ${(performance.now() - t0).toFixed(0)} ms\n`,
  );
}
