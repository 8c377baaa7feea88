/**
 * A TIFF file built by hand after the TIFF 6.0 specification (Adobe, 1992): section 2 (header and
 * IFD layout, field types SHORT = 3 and LONG = 4), section 8 (baseline RGB: tags 256, 257, 258,
 * 259, 262, 273, 277, 278, 279), section 4 (greyscale, PhotometricInterpretation 0 = WhiteIsZero,
 * 1 = BlackIsZero). For the desk's tests of TIFF scans.
 */
interface Entry { tag: number; type: 3 | 4; values: number[] }

/** An uncompressed, one-strip, little-endian TIFF of the given samples. */
export function tiffFile(width: number, height: number, bits: 8 | 16, samples: number, photometric: number, pixels: number[]): Uint8Array {
  const bytesPerSample = bits / 8;
  const imageBytes = pixels.length * bytesPerSample;
  const entries: Entry[] = [
    { tag: 256, type: 3, values: [width] },
    { tag: 257, type: 3, values: [height] },
    { tag: 258, type: 3, values: Array(samples).fill(bits) },
    { tag: 259, type: 3, values: [1] },
    { tag: 262, type: 3, values: [photometric] },
    { tag: 273, type: 4, values: [0] }, // strip offset, set below
    { tag: 277, type: 3, values: [samples] },
    { tag: 278, type: 3, values: [height] },
    { tag: 279, type: 4, values: [imageBytes] },
  ];
  const ifdOffset = 8;
  const ifdSize = 2 + entries.length * 12 + 4;
  let extraOffset = ifdOffset + ifdSize;
  const extra: { at: number; entry: Entry }[] = [];
  for (const e of entries) {
    const size = e.values.length * (e.type === 3 ? 2 : 4);
    if (size > 4) {
      extra.push({ at: extraOffset, entry: e });
      extraOffset += size;
    }
  }
  const imageOffset = extraOffset;
  entries.find((e) => e.tag === 273)!.values[0] = imageOffset;
  const buffer = new ArrayBuffer(imageOffset + imageBytes);
  const view = new DataView(buffer);
  view.setUint8(0, 0x49);
  view.setUint8(1, 0x49);
  view.setUint16(2, 42, true);
  view.setUint32(4, ifdOffset, true);
  view.setUint16(ifdOffset, entries.length, true);
  entries.forEach((e, k) => {
    const at = ifdOffset + 2 + 12 * k;
    view.setUint16(at, e.tag, true);
    view.setUint16(at + 2, e.type, true);
    view.setUint32(at + 4, e.values.length, true);
    const outside = extra.find((x) => x.entry === e);
    if (outside) view.setUint32(at + 8, outside.at, true);
    else e.values.forEach((v, i) => (e.type === 3 ? view.setUint16(at + 8 + 2 * i, v, true) : view.setUint32(at + 8 + 4 * i, v, true)));
  });
  view.setUint32(ifdOffset + 2 + 12 * entries.length, 0, true);
  for (const { at, entry } of extra) entry.values.forEach((v, i) => view.setUint16(at + 2 * i, v, true));
  pixels.forEach((v, i) => (bits === 8 ? view.setUint8(imageOffset + i, v) : view.setUint16(imageOffset + 2 * i, v, true)));
  return new Uint8Array(buffer);
}

