/** Offers bytes as a download under a plain file name, through an <a download> of a Blob URL. */
export function downloadBytes(name: string, bytes: Uint8Array, type: string): void {
  const url = URL.createObjectURL(new Blob([bytes as Uint8Array<ArrayBuffer>], { type }));
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
