/** Offers bytes as a download under a plain file name, through an <a download> of a Blob URL. */

/** The media type of each export file, by its name's ending. */
export function mediaType(name: string): string {
  if (name.endsWith('.svg')) return 'image/svg+xml';
  if (name.endsWith('.png')) return 'image/png';
  if (name.endsWith('.zip')) return 'application/zip';
  if (name.endsWith('.xml')) return 'application/tei+xml';
  if (name.endsWith('.jsonld')) return 'application/ld+json';
  return 'application/octet-stream';
}

export function downloadBytes(name: string, bytes: Uint8Array): void {
  const url = URL.createObjectURL(new Blob([bytes as Uint8Array<ArrayBuffer>], { type: mediaType(name) }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.style.display = 'none';
  document.body.append(a);
  a.click();
  a.remove();
  // The download has started by now; give it a moment before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
