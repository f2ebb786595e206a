/**
 * The schema of project.json (zod), with migrations from older versions: every project
 * read from a file or from the browser's store goes through parseProject, so a damaged or
 * foreign file gives one clear message instead of a half-loaded project.
 */
import { z } from 'zod';
import { PROJECT_VERSION, type Project } from './model.ts';

const finite = z.number().refine(Number.isFinite, 'must be a finite number');
const nonNeg = finite.refine((v) => v >= 0, 'must not be negative');

const weights = z.object({ adherence: nonNeg, widthChange: nonNeg, curvature: nonNeg, length: nonNeg });
const settings = z.object({
  weights,
  radius: z.tuple([finite, finite]).refine(([a, b]) => a > 0 && b > a, 'radius range needs 0 < min < max'),
});
const span = z.object({ from: z.number().int().nonnegative(), to: z.number().int().nonnegative() })
  .refine((s) => s.to >= s.from, 'a span ends before it starts');
const sample = z.object({ x: finite, y: finite, r: nonNeg, support: z.number() });
const cost = z.object({ adherence: finite, widthChange: finite, curvature: finite, length: finite, total: finite });

const stroke = z.object({
  id: z.string().min(1),
  surfaceId: z.string().min(1),
  anchors: z.array(z.object({ x: finite, y: finite, r: nonNeg.optional() })).min(2),
  settings: settings.optional(),
  samples: z.array(sample).min(2),
  restoredSpans: z.array(span),
  overrides: z.array(span.and(z.object({ kind: z.enum(['restored', 'inked']) }))),
  cost,
  hidden: z.boolean(),
});

const image = z.object({
  id: z.string().min(1),
  band: z.string().min(1),
  file: z.string().min(1),
  mime: z.enum(['image/png', 'image/jpeg']),
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  bitDepth: z.number().int().positive(),
});

const scaleSource = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('ruler'), x0: finite, y0: finite, x1: finite, y1: finite, mm: finite.refine((v) => v > 0, 'a ruler length must be positive') }),
  z.object({ kind: z.literal('file'), detail: z.string() }),
]);

const surface = z.object({
  id: z.string().min(1),
  name: z.string(),
  images: z.array(image).min(1),
  pxPerMm: finite.refine((v) => v > 0, 'scale must be positive').optional(),
  scaleSource: scaleSource.optional(),
  strokeOrder: z.array(z.string()),
});

const textPlace = {
  line: z.number().int().positive(),
  lineByHand: z.boolean(),
  order: z.number().int().positive(),
};

const letter = z.object({
  id: z.string().min(1),
  surfaceId: z.string().min(1),
  strokeIds: z.array(z.string().min(1)).min(1),
  label: z.string(),
  reading: z.enum(['clear', 'doubtful']),
  restored: z.boolean(),
  ...textPlace,
});

const textMark = z.object({
  id: z.string().min(1),
  surfaceId: z.string().min(1),
  kind: z.enum(['divider', 'lacuna']),
  x: finite,
  y: finite,
  lost: z.number().int().positive().optional(),
  ...textPlace,
});

const inscription = z.object({
  script: z.string().min(1),
  direction: z.enum(['ltr', 'rtl']),
  description: z.string(),
  creator: z.string(),
});

export const projectSchema = z.object({
  format: z.literal('inkroute-project'),
  version: z.literal(PROJECT_VERSION),
  id: z.string().min(1),
  title: z.string(),
  createdAt: z.string(),
  modifiedAt: z.string(),
  defaults: settings,
  surfaces: z.array(surface).min(1),
  strokes: z.record(z.string(), stroke),
  inscription,
  letters: z.record(z.string(), letter),
  textMarks: z.record(z.string(), textMark),
});

/** Thrown for a project that cannot be read; the message is one plain sentence. */
export class ProjectFormatError extends Error {
  override name = 'ProjectFormatError';
}

/** What a project of version 1 (strokes only) reads as: no letters yet, a Latin left-to-right text. */
export const V1_INSCRIPTION = { script: 'Latin', direction: 'ltr', description: '', creator: '' } as const;

/** Upgrades older project.json versions step by step: MIGRATIONS[v] turns version v into v + 1. */
const MIGRATIONS: Record<number, (old: Record<string, unknown>) => Record<string, unknown>> = {
  // 1 → 2: letters, text marks and the inscription's script and reading direction.
  1: (old) => ({ ...old, version: 2, inscription: { ...V1_INSCRIPTION }, letters: {}, textMarks: {} }),
};

export function parseProject(json: unknown): Project {
  if (typeof json !== 'object' || json === null) throw new ProjectFormatError('project.json is not a JSON object.');
  let doc = json as Record<string, unknown>;
  if (doc.format !== 'inkroute-project') throw new ProjectFormatError('this is not an inkroute project (project.json has no inkroute format tag).');
  let version = typeof doc.version === 'number' ? doc.version : NaN;
  if (!(version >= 1)) throw new ProjectFormatError('project.json has no valid version number.');
  if (version > PROJECT_VERSION) {
    throw new ProjectFormatError(`this project was saved by a newer inkroute (file version ${version}, this one reads up to ${PROJECT_VERSION}).`);
  }
  while (version < PROJECT_VERSION) {
    const step = MIGRATIONS[version];
    if (!step) throw new ProjectFormatError(`no migration from project version ${version}.`);
    doc = step(doc);
    version++;
  }
  const res = projectSchema.safeParse(doc);
  if (!res.success) {
    const issue = res.error.issues[0];
    throw new ProjectFormatError(`project.json is invalid at ${issue.path.join('.') || 'the top'}: ${issue.message}.`);
  }
  const project = res.data as Project;
  for (const s of project.surfaces) {
    for (const id of s.strokeOrder) {
      const st = project.strokes[id];
      if (!st) throw new ProjectFormatError(`surface ${s.name} lists a stroke ${id} that the project does not have.`);
      if (st.surfaceId !== s.id) throw new ProjectFormatError(`stroke ${id} is listed on a surface it does not belong to.`);
    }
  }
  const letterOf = new Map<string, string>();
  for (const l of Object.values(project.letters)) {
    if (!project.surfaces.some((s) => s.id === l.surfaceId)) throw new ProjectFormatError(`letter ${l.id} is on a surface the project does not have.`);
    for (const id of l.strokeIds) {
      const other = letterOf.get(id);
      if (other) throw new ProjectFormatError(`stroke ${id} belongs to two letters (${other} and ${l.id}).`);
      letterOf.set(id, l.id);
      const st = project.strokes[id];
      if (!st) throw new ProjectFormatError(`letter ${l.id} has a stroke ${id} that the project does not have.`);
      if (st.surfaceId !== l.surfaceId) throw new ProjectFormatError(`letter ${l.id} has a stroke ${id} of another surface.`);
    }
  }
  for (const m of Object.values(project.textMarks)) {
    if (!project.surfaces.some((s) => s.id === m.surfaceId)) throw new ProjectFormatError(`text mark ${m.id} is on a surface the project does not have.`);
  }
  return project;
}
