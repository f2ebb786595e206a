/**
 * The project file NAME.inkroute: a zip holding project.json and the images it names
 * (the original files, byte for byte). Pure TypeScript (fflate), so the CLI, the tests
 * and the editor read and write the same bytes.
 */
import { strFromU8, strToU8, unzipSync, zipSync, type Zippable } from 'fflate';
import type { Project } from './model.ts';
import { parseProject, ProjectFormatError } from './schema.ts';

export interface ProjectBundle {
  project: Project;
  /** Image bytes by their file path inside the bundle. */
  images: Map<string, Uint8Array>;
}

/** Writes the bundle; fixed timestamps keep the bytes the same for the same project. */
export function writeProjectFile(bundle: ProjectBundle): Uint8Array {
  const files: Zippable = {};
  const mtime = new Date(Date.UTC(2000, 0, 1));
  files['project.json'] = [strToU8(JSON.stringify(bundle.project, null, 1)), { level: 6, mtime }];
  for (const surface of bundle.project.surfaces) {
    for (const img of surface.images) {
      const bytes = bundle.images.get(img.file);
      if (!bytes) throw new Error(`internal: the image ${img.file} is missing from the bundle`);
      // Images are already compressed: store them.
      files[img.file] = [bytes, { level: 0, mtime }];
    }
  }
  return zipSync(files);
}

export function readProjectFile(bytes: Uint8Array): ProjectBundle {
  let entries: Record<string, Uint8Array>;
  try {
    entries = unzipSync(bytes);
  } catch (e) {
    throw new ProjectFormatError(`the project file is damaged or not a zip (${(e as Error).message}).`);
  }
  const json = entries['project.json'];
  if (!json) throw new ProjectFormatError('the project file has no project.json.');
  let parsed: unknown;
  try {
    parsed = JSON.parse(strFromU8(json));
  } catch {
    throw new ProjectFormatError('project.json is not valid JSON.');
  }
  const project = parseProject(parsed);
  const images = new Map<string, Uint8Array>();
  for (const surface of project.surfaces) {
    for (const img of surface.images) {
      const data = entries[img.file];
      if (!data) throw new ProjectFormatError(`the project file lacks the image ${img.file}.`);
      images.set(img.file, data);
    }
  }
  return { project, images };
}
