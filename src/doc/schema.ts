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

const surface = z.object({
  id: z.string().min(1),
  name: z.string(),
  images: z.array(image).min(1),
  pxPerMm: finite.refine((v) => v > 0, 'scale must be positive').optional(),
  strokeOrder: z.array(z.string()),
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
});

/** Thrown for a project that cannot be read; the message is one plain sentence. */
export class ProjectFormatError extends Error {
  override name = 'ProjectFormatError';
}

/** Upgrades older project.json versions step by step (none yet: version 1 is the first). */
const MIGRATIONS: Record<number, (old: Record<string, unknown>) => Record<string, unknown>> = {};

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
  return project;
}
