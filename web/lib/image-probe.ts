/**
 * What an uploaded image really is, from its first bytes (never its name or declared type):
 * JPEG, PNG or WebP, with the pixel size read from the header. Anything else is not an image
 * we accept. Pure, no image library.
 */

export type ImageType = "image/jpeg" | "image/png" | "image/webp";

/** The type and pixel size of an accepted image. */
export interface ImageInfo {
  contentType: ImageType;
  width: number;
  height: number;
}

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function startsWith(b: Uint8Array, sig: number[], at = 0): boolean {
  return sig.every((x, i) => b[at + i] === x);
}

function ascii(b: Uint8Array, at: number, n: number): string {
  return String.fromCharCode(...b.subarray(at, at + n));
}

function u16be(b: Uint8Array, at: number): number {
  return (b[at]! << 8) | b[at + 1]!;
}

function u32be(b: Uint8Array, at: number): number {
  return ((b[at]! << 24) >>> 0) + (b[at + 1]! << 16) + (b[at + 2]! << 8) + b[at + 3]!;
}

function u24le(b: Uint8Array, at: number): number {
  return b[at]! | (b[at + 1]! << 8) | (b[at + 2]! << 16);
}

function probePng(b: Uint8Array): ImageInfo | null {
  // The first chunk must be IHDR: width and height are its first two big-endian words.
  if (b.length < 24 || ascii(b, 12, 4) !== "IHDR") return null;
  return { contentType: "image/png", width: u32be(b, 16), height: u32be(b, 20) };
}

// JPEG start-of-frame markers (C0..CF except DHT C4, JPG C8 and DAC CC) carry the frame size.
function isStartOfFrame(marker: number): boolean {
  return marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
}

function probeJpeg(b: Uint8Array): ImageInfo | null {
  let at = 2;
  while (at + 4 <= b.length) {
    if (b[at] !== 0xff) return null;
    const marker = b[at + 1]!;
    if (marker === 0xff) {
      at += 1; // fill byte
      continue;
    }
    if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
      at += 2; // markers without a length
      continue;
    }
    if (marker === 0xd9 || marker === 0xda) return null; // end of image or scan data before any frame header
    const length = u16be(b, at + 2);
    if (length < 2) return null;
    if (isStartOfFrame(marker)) {
      if (at + 9 > b.length) return null;
      return { contentType: "image/jpeg", height: u16be(b, at + 5), width: u16be(b, at + 7) };
    }
    at += 2 + length;
  }
  return null;
}

function probeWebp(b: Uint8Array): ImageInfo | null {
  if (b.length < 30) return null;
  const chunk = ascii(b, 12, 4);
  if (chunk === "VP8 ") {
    // Lossy: a 3-byte frame tag, the start code 9d 01 2a, then 14-bit width and height.
    if (!startsWith(b, [0x9d, 0x01, 0x2a], 23)) return null;
    return {
      contentType: "image/webp",
      width: (b[26]! | (b[27]! << 8)) & 0x3fff,
      height: (b[28]! | (b[29]! << 8)) & 0x3fff,
    };
  }
  if (chunk === "VP8L") {
    // Lossless: signature 0x2f, then width-1 and height-1 in 14 bits each, little-endian bit order.
    if (b[20] !== 0x2f) return null;
    const bits = b[21]! | (b[22]! << 8) | (b[23]! << 16) | (b[24]! << 24);
    return {
      contentType: "image/webp",
      width: (bits & 0x3fff) + 1,
      height: ((bits >>> 14) & 0x3fff) + 1,
    };
  }
  if (chunk === "VP8X") {
    // Extended: canvas width-1 and height-1 in 24 bits each.
    return { contentType: "image/webp", width: u24le(b, 24) + 1, height: u24le(b, 27) + 1 };
  }
  return null;
}

/** The image's real type and size from its bytes, or null when it is not a JPEG, PNG or WebP. */
export function probeImage(bytes: Uint8Array): ImageInfo | null {
  let info: ImageInfo | null = null;
  if (startsWith(bytes, PNG_SIGNATURE)) info = probePng(bytes);
  else if (startsWith(bytes, [0xff, 0xd8, 0xff])) info = probeJpeg(bytes);
  else if (bytes.length >= 12 && ascii(bytes, 0, 4) === "RIFF" && ascii(bytes, 8, 4) === "WEBP")
    info = probeWebp(bytes);
  return info !== null && info.width > 0 && info.height > 0 ? info : null;
}
