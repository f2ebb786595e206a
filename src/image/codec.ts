/**
 * Decoding and encoding of raster files into single-band float images.
 * PNG (8 and 16 bit, grey, grey+alpha, RGB, RGBA, palette) and baseline JPEG are read;
 * colour is turned into luma with the Rec. 601 weights (common practice for greyscale
 * conversion). PNG is written as 8- or 16-bit greyscale.
 */
import { decode as decodePngRaw, encode as encodePngRaw, convertIndexedToRgb, hasPngSignature } from 'fast-png';
import jpeg from 'jpeg-js';
import { createGray, type GrayImage } from './gray.ts';

/** Thrown for input that is not a readable image; the message is one plain sentence. */
export class ImageFormatError extends Error {
  override name = 'ImageFormatError';
}

export interface DecodedImage {
  /** One image per band. A colour file gives one band: its luma. */
  bands: GrayImage[];
  /** Bits per sample of the source. */
  bitDepth: number;
  /** Pixels per millimetre from the file's resolution tag, when it has one. */
  pxPerMm?: number;
  format: 'png' | 'jpeg';
}

/** Largest image accepted, in pixels (guards memory against corrupt headers). */
export const MAX_PIXELS = 120_000_000;

export function sniffFormat(bytes: Uint8Array): 'png' | 'jpeg' | 'tiff' | undefined {
  if (bytes.length >= 8 && hasPngSignature(bytes)) return 'png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpeg';
  if (bytes.length >= 4 && ((bytes[0] === 0x49 && bytes[1] === 0x49 && bytes[2] === 42 && bytes[3] === 0) ||
      (bytes[0] === 0x4d && bytes[1] === 0x4d && bytes[2] === 0 && bytes[3] === 42))) return 'tiff';
  return undefined;
}

export function decodeImage(bytes: Uint8Array): DecodedImage {
  const kind = sniffFormat(bytes);
  if (kind === 'png') return decodePngFile(bytes);
  if (kind === 'jpeg') return decodeJpegFile(bytes);
  if (kind === 'tiff') throw new ImageFormatError('TIFF files are not supported yet; use PNG or JPEG.');
  throw new ImageFormatError('not an image: the file is neither PNG nor JPEG.');
}

function lumaFromInterleaved(
  data: ArrayLike<number>, width: number, height: number, channels: number, max: number,
): GrayImage {
  const n = width * height;
  const out = new Float32Array(n);
  const inv = 1 / max;
  if (channels <= 2) {
    for (let p = 0, s = 0; p < n; p++, s += channels) out[p] = data[s] * inv;
  } else {
    for (let p = 0, s = 0; p < n; p++, s += channels) {
      out[p] = (0.299 * data[s] + 0.587 * data[s + 1] + 0.114 * data[s + 2]) * inv;
    }
  }
  return createGray(width, height, out);
}

function checkSize(width: number, height: number): void {
  if (!(width > 0 && height > 0)) throw new ImageFormatError('the image has no pixels.');
  if (width * height > MAX_PIXELS) {
    throw new ImageFormatError(`the image is too large (${width}×${height}); the limit is ${MAX_PIXELS / 1e6} megapixels.`);
  }
}

function decodePngFile(bytes: Uint8Array): DecodedImage {
  let png;
  try {
    png = decodePngRaw(bytes);
  } catch (e) {
    throw new ImageFormatError(`the PNG file is damaged or truncated (${(e as Error).message}).`);
  }
  checkSize(png.width, png.height);
  let data: ArrayLike<number> = png.data;
  let channels = png.channels;
  let max = png.depth === 16 ? 65535 : (1 << png.depth) - 1;
  if (png.palette) {
    data = convertIndexedToRgb(png);
    channels = png.transparency ? 4 : 3;
    max = 255;
  } else if (png.depth < 8) {
    // 1-, 2- and 4-bit grey come packed, each row starting on a byte (PNG specification, 7.2).
    data = unpackSamples(png.data as Uint8Array, png.width, png.height, channels, png.depth);
  }
  if (data.length < png.width * png.height * channels) {
    throw new ImageFormatError('the PNG file is truncated: it holds fewer pixels than its header says.');
  }
  const band = lumaFromInterleaved(data, png.width, png.height, channels, max);
  let pxPerMm: number | undefined;
  if (png.resolution && png.resolution.unit === 1 && png.resolution.x > 0) pxPerMm = png.resolution.x / 1000;
  return { bands: [band], bitDepth: png.depth, pxPerMm, format: 'png' };
}

/** Samples of `depth` < 8 bits, packed with each row starting on a byte, one per entry. */
export function unpackSamples(packed: Uint8Array, width: number, height: number, channels: number, depth: number): Uint8Array {
  const perRow = width * channels;
  const rowBytes = Math.ceil((perRow * depth) / 8);
  const out = new Uint8Array(perRow * height);
  if (packed.length < rowBytes * height) return out.subarray(0, 0); // the caller reports it as truncated
  const mask = (1 << depth) - 1;
  for (let y = 0; y < height; y++) {
    const row = y * rowBytes;
    for (let i = 0; i < perRow; i++) {
      const bit = i * depth;
      out[y * perRow + i] = (packed[row + (bit >> 3)] >> (8 - depth - (bit & 7))) & mask;
    }
  }
  return out;
}

/**
 * The pixel density of a JPEG's JFIF APP0 segment (JPEG File Interchange Format 1.02:
 * units 1 = dots per inch, 2 = dots per cm; 0 gives only an aspect ratio), in px per mm.
 */
export function jfifPxPerMm(bytes: Uint8Array): number | undefined {
  // SOI, then APP0 (FF E0) with its length, 'JFIF\0', version (2), units, Xdensity, Ydensity.
  if (bytes.length < 18 || bytes[2] !== 0xff || bytes[3] !== 0xe0) return undefined;
  const id = String.fromCharCode(bytes[6], bytes[7], bytes[8], bytes[9]);
  if (id !== 'JFIF' || bytes[10] !== 0) return undefined;
  const units = bytes[13];
  const x = (bytes[14] << 8) | bytes[15];
  if (x <= 0) return undefined;
  if (units === 1) return x / 25.4;
  if (units === 2) return x / 10;
  return undefined;
}

function decodeJpegFile(bytes: Uint8Array): DecodedImage {
  let img;
  try {
    img = jpeg.decode(bytes, { useTArray: true, formatAsRGBA: true, maxResolutionInMP: MAX_PIXELS / 1e6, maxMemoryUsageInMB: 4096 });
  } catch (e) {
    throw new ImageFormatError(`the JPEG file is damaged or truncated (${(e as Error).message}).`);
  }
  checkSize(img.width, img.height);
  const band = lumaFromInterleaved(img.data, img.width, img.height, 4, 255);
  return { bands: [band], bitDepth: 8, pxPerMm: jfifPxPerMm(bytes), format: 'jpeg' };
}

export interface EncodePngOptions {
  /** Bits per sample, 8 (default) or 16. */
  depth?: 8 | 16;
  /** Resolution tag (pHYs) in pixels per millimetre, written as pixels per metre. */
  pxPerMm?: number;
}

/** Encodes a float image (values clamped to [0, 1]) as a greyscale PNG. */
export function encodeGrayPng(img: GrayImage, options: EncodePngOptions = {}): Uint8Array {
  const depth = options.depth ?? 8;
  const n = img.width * img.height;
  const max = depth === 16 ? 65535 : 255;
  const data = depth === 16 ? new Uint16Array(n) : new Uint8Array(n);
  const src = img.data;
  for (let p = 0; p < n; p++) {
    const v = src[p];
    data[p] = v <= 0 ? 0 : v >= 1 ? max : Math.round(v * max);
  }
  const bytes = encodePngRaw({ width: img.width, height: img.height, data, depth, channels: 1 });
  return options.pxPerMm ? withPhys(bytes, Math.round(options.pxPerMm * 1000)) : bytes;
}

/** Inserts a pHYs chunk (pixels per metre, unit 1) right after IHDR. */
export function withPhys(png: Uint8Array, pxPerMetre: number): Uint8Array {
  const chunk = new Uint8Array(21);
  const view = new DataView(chunk.buffer);
  view.setUint32(0, 9);
  chunk.set([0x70, 0x48, 0x59, 0x73], 4); // "pHYs"
  view.setUint32(8, pxPerMetre);
  view.setUint32(12, pxPerMetre);
  chunk[16] = 1;
  view.setUint32(17, crc32(chunk.subarray(4, 17)));
  const ihdrEnd = 8 + 25; // signature + IHDR (4 length + 4 type + 13 data + 4 crc)
  const out = new Uint8Array(png.length + chunk.length);
  out.set(png.subarray(0, ihdrEnd), 0);
  out.set(chunk, ihdrEnd);
  out.set(png.subarray(ihdrEnd), ihdrEnd + chunk.length);
  return out;
}

let crcTable: Uint32Array | undefined;
/** CRC-32 as defined in the PNG specification (ISO 3309 polynomial). */
export function crc32(bytes: Uint8Array): number {
  if (!crcTable) {
    crcTable = new Uint32Array(256);
    for (let n = 0; n < 256; n++) {
      let c = n;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      crcTable[n] = c >>> 0;
    }
  }
  let c = 0xffffffff;
  for (let i = 0; i < bytes.length; i++) c = crcTable[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
