/**
 * A minimal PNG encoder for the seed's drawn board sketches: 8-bit RGB, no interlace, every
 * scanline with filter 0, compressed by node:zlib. Enough for flat-colour drawings; the seed
 * needs no image library.
 */
import { crc32, deflateSync } from "node:zlib";

/** An RGB raster: `width × height` pixels, three bytes each, row by row from the top. */
export interface Raster {
  width: number;
  height: number;
  rgb: Uint8Array;
}

const SIGNATURE = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function chunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, "ascii");
  Buffer.from(data).copy(out, 8);
  // The CRC covers the type and the data, not the length.
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)) >>> 0, 8 + data.length);
  return out;
}

/** The PNG file bytes of a raster. */
export function encodePng(r: Raster): Uint8Array {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(r.width, 0);
  ihdr.writeUInt32BE(r.height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type: truecolour
  ihdr[10] = 0; // deflate
  ihdr[11] = 0; // adaptive filtering, filter type per line
  ihdr[12] = 0; // no interlace
  const stride = r.width * 3;
  const raw = Buffer.alloc((stride + 1) * r.height);
  for (let y = 0; y < r.height; y++) {
    raw[y * (stride + 1)] = 0; // filter: none
    Buffer.from(r.rgb.buffer, r.rgb.byteOffset + y * stride, stride).copy(
      raw,
      y * (stride + 1) + 1,
    );
  }
  return new Uint8Array(
    Buffer.concat([
      Buffer.from(SIGNATURE),
      chunk("IHDR", ihdr),
      chunk("IDAT", deflateSync(raw, { level: 9 })),
      chunk("IEND", new Uint8Array(0)),
    ]),
  );
}
