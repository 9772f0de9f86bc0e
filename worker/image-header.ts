/**
 * Reads a photo's pixel size and EXIF orientation from its first bytes, without decoding it, so
 * the decoder can be asked for the working resolution straight away (a 12 MP photo decoded in
 * full takes 48 MB that a phone may not have to spare).
 *
 * JPEG: the SOFn segment gives the stored size; the EXIF APP1 segment's Orientation tag (0x0112)
 * says whether the upright picture is rotated by 90° (values 5–8 swap width and height).
 * PNG: the IHDR chunk (PNG has no EXIF orientation in common use).
 * Anything else: null, and the caller decodes in full.
 */

export interface ImageHeader {
  /** Upright size, after the EXIF orientation is applied. */
  width: number;
  height: number;
  orientation: number;
}

export function readImageHeader(bytes: Uint8Array): ImageHeader | null {
  if (bytes[0] === 0x89 && bytes[1] === 0x50 && bytes[2] === 0x4e && bytes[3] === 0x47) {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    if (bytes.length < 24) return null;
    return { width: view.getUint32(16), height: view.getUint32(20), orientation: 1 };
  }
  if (bytes[0] === 0xff && bytes[1] === 0xd8) return readJpeg(bytes);
  return null;
}

function readJpeg(bytes: Uint8Array): ImageHeader | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let orientation = 1;
  let pos = 2;
  while (pos + 4 <= bytes.length) {
    if (bytes[pos] !== 0xff) return null;
    const marker = bytes[pos + 1]!;
    const length = view.getUint16(pos + 2);
    // SOF0..SOF15 carry the frame size, except DHT (C4), JPG (C8) and DAC (CC).
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      if (pos + 9 > bytes.length) return null;
      const height = view.getUint16(pos + 5);
      const width = view.getUint16(pos + 7);
      const swap = orientation >= 5 && orientation <= 8;
      return { width: swap ? height : width, height: swap ? width : height, orientation };
    }
    if (marker === 0xe1) orientation = exifOrientation(view, pos + 4, length - 2) ?? orientation;
    pos += 2 + length;
  }
  return null;
}

function exifOrientation(view: DataView, start: number, length: number): number | null {
  // "Exif\0\0" then a TIFF header: byte order, 42, offset of the first IFD.
  if (start + 14 > view.byteLength || view.getUint32(start) !== 0x45786966) return null;
  const tiff = start + 6;
  const little = view.getUint16(tiff) === 0x4949;
  const ifd = tiff + view.getUint32(tiff + 4, little);
  const end = Math.min(view.byteLength, start + length);
  if (ifd + 2 > end) return null;
  const entries = view.getUint16(ifd, little);
  for (let i = 0; i < entries; i++) {
    const entry = ifd + 2 + i * 12;
    if (entry + 12 > end) return null;
    if (view.getUint16(entry, little) === 0x0112) return view.getUint16(entry + 8, little);
  }
  return null;
}
