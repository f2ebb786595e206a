/** Export files as downloads. */
import { downloadBytes } from '../persist/download.ts';

/** The media type of each export file, by its name's ending. */
export function mediaType(name: string): string {
  if (name.endsWith('.svg')) return 'image/svg+xml';
  if (name.endsWith('.png')) return 'image/png';
  if (name.endsWith('.zip')) return 'application/zip';
  if (name.endsWith('.xml')) return 'application/tei+xml';
  if (name.endsWith('.jsonld')) return 'application/ld+json';
  return 'application/octet-stream';
}

/** Offers an export file as a download, typed by its name. */
export function downloadExport(name: string, bytes: Uint8Array): void {
  downloadBytes(name, bytes, mediaType(name));
}
