/**
 * Image decoding details checked against the file format specifications: packed 1-, 2-
 * and 4-bit grey PNG (PNG specification, 7.2 "Scanlines": samples packed into bytes,
 * leftmost in the high-order bits, each row starting on a byte), and the JFIF APP0 density
 * (JPEG File Interchange Format 1.02: units 1 = dots per inch, 2 = dots per cm).
 */
import { encode as encodePng } from 'fast-png';
import jpeg from 'jpeg-js';
import { describe, expect, it } from 'vitest';
import { decodeImage, jfifPxPerMm, unpackSamples } from '../src/image/codec.ts';

describe('packed grey PNG', () => {
  it('unpacks 1-bit rows that start on a byte', () => {
    // 3 px per row: row 0 = 1 0 1 (0b101_00000), row 1 = 0 1 0 (0b010_00000), by hand.
    expect([...unpackSamples(new Uint8Array([0b10100000, 0b01000000]), 3, 2, 1, 1)]).toEqual([1, 0, 1, 0, 1, 0]);
    // 2-bit: 0b11_10_01_00 → 3 2 1 0; 4-bit: 0xA5 → 10 5.
    expect([...unpackSamples(new Uint8Array([0b11100100]), 4, 1, 1, 2)]).toEqual([3, 2, 1, 0]);
    expect([...unpackSamples(new Uint8Array([0xa5]), 2, 1, 1, 4)]).toEqual([10, 5]);
  });

  it('decodes a 1-bit binarization as 0 and 1 luma, not as a truncated file', () => {
    const png = encodePng({ width: 3, height: 2, data: new Uint8Array([0b10100000, 0b01000000]), depth: 1, channels: 1 });
    const img = decodeImage(png);
    expect(img.bitDepth).toBe(1);
    expect([...img.bands[0].data]).toEqual([1, 0, 1, 0, 1, 0]);
  });

  it('decodes 4-bit grey to its fifteenths', () => {
    const png = encodePng({ width: 2, height: 1, data: new Uint8Array([0xf3]), depth: 4, channels: 1 });
    const [a, b] = decodeImage(png).bands[0].data;
    expect(a).toBeCloseTo(1, 6);
    expect(b).toBeCloseTo(3 / 15, 6);
  });
});

describe('JFIF density', () => {
  function jpegWithDensity(units: number, x: number): Uint8Array {
    const j = new Uint8Array(jpeg.encode({ width: 2, height: 2, data: new Uint8Array(16).fill(200) }, 90).data);
    // APP0 layout (JFIF 1.02): FF D8 FF E0 len(2) 'JFIF' 0 version(2) units Xdensity(2) Ydensity(2).
    j[13] = units;
    j[14] = x >> 8;
    j[15] = x & 255;
    j[16] = x >> 8;
    j[17] = x & 255;
    return j;
  }

  it('reads dots per inch and dots per cm as px per mm', () => {
    expect(jfifPxPerMm(jpegWithDensity(1, 300))).toBeCloseTo(300 / 25.4, 9); // 25.4 mm per inch
    expect(jfifPxPerMm(jpegWithDensity(2, 120))).toBeCloseTo(12, 9);
    expect(decodeImage(jpegWithDensity(1, 600)).pxPerMm).toBeCloseTo(600 / 25.4, 9);
  });

  it('gives no scale for an aspect ratio only (units 0) or a file without JFIF', () => {
    expect(jfifPxPerMm(jpegWithDensity(0, 1))).toBeUndefined();
    expect(jfifPxPerMm(new Uint8Array([0xff, 0xd8, 0xff, 0xdb, 0, 4, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]))).toBeUndefined();
  });
});
