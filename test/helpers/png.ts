/**
 * Reading a PNG's pHYs chunk chunk by chunk, independently of the writer (PNG
 * specification, 5.3 chunk layout: length (4), type (4), data, CRC (4) after the 8-byte
 * signature; 11.3.5.3 pHYs: pixels per unit in x and y, then the unit, 1 = metre).
 */
export function pngPhys(bytes: Uint8Array): { x: number; y: number; unit: number } | undefined {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let at = 8; at + 8 <= bytes.length;) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...bytes.subarray(at + 4, at + 8));
    if (type === 'pHYs') return { x: view.getUint32(at + 8), y: view.getUint32(at + 12), unit: bytes[at + 16] };
    // pHYs must come before the image data (11.3.5.3).
    if (type === 'IDAT' || type === 'IEND') return undefined;
    at += 12 + length;
  }
  return undefined;
}
