/**
 * Logo uploads are judged from the image header alone. The byte layouts follow the file-format
 * specifications: PNG (ISO/IEC 15948, W3C PNG 2nd ed. §5.2–5.3: signature, then the IHDR chunk
 * with width and height as 4-byte big-endian integers) and JPEG (ITU-T T.81 §B.2.2: a SOF0 marker
 * segment holds height then width as 2-byte big-endian integers), after a JFIF APP0 segment.
 */
import { describe, expect, it } from 'vitest';
import { checkUploadedImage, readImageHeader, withinImageLimits } from '../../server/lib/image-guard';

function pngHeader(width: number, height: number): Buffer {
  const sig = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  const ihdr = Buffer.alloc(25);
  ihdr.writeUInt32BE(13, 0);
  ihdr.write('IHDR', 4, 'ascii');
  ihdr.writeUInt32BE(width, 8);
  ihdr.writeUInt32BE(height, 12);
  ihdr.writeUInt8(8, 16); // bit depth
  ihdr.writeUInt8(6, 17); // RGBA
  return Buffer.concat([sig, ihdr, Buffer.alloc(64)]); // no image data at all: nothing could be decoded
}

function jpegHeader(width: number, height: number): Buffer {
  const sof = Buffer.from([0xff, 0xc0, 0x00, 0x11, 0x08, 0, 0, 0, 0, 0x03, 1, 0x22, 0, 2, 0x11, 1, 3, 0x11, 1]);
  sof.writeUInt16BE(height, 5);
  sof.writeUInt16BE(width, 7);
  // APP0 "JFIF" segment (JFIF 1.02): 16-byte length, version 1.1, no thumbnail.
  const app0 = Buffer.from([0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof, Buffer.from([0xff, 0xd9])]);
}

describe('image guard', () => {
  it('reads dimensions from PNG and JPEG headers', () => {
    expect(readImageHeader(pngHeader(640, 200))).toEqual({ format: 'png', width: 640, height: 200 });
    expect(readImageHeader(jpegHeader(1200, 400))).toEqual({ format: 'jpg', width: 1200, height: 400 });
    expect(readImageHeader(Buffer.from('GIF89a not ours'))).toBeNull();
    expect(readImageHeader(Buffer.from('plain text'))).toBeNull();
  });

  it('refuses an image that claims 8000 × 8000 px before decoding anything', () => {
    expect(() => checkUploadedImage(pngHeader(8000, 8000))).toThrow(expect.objectContaining({ code: 'IMAGE_TOO_LARGE', status: 422 }));
  });

  it('applies both the side limit (2000 px) and the 4-megapixel limit', () => {
    expect(withinImageLimits({ width: 2000, height: 2000 })).toBe(true); // exactly 4.0 MP and 2000 px
    expect(withinImageLimits({ width: 2001, height: 10 })).toBe(false);
    expect(withinImageLimits({ width: 2000, height: 2001 })).toBe(false);
    expect(withinImageLimits({ width: 1999, height: 1999 })).toBe(true);
    expect(() => checkUploadedImage(jpegHeader(2400, 300))).toThrow(/2400 × 300 px/);
    expect(checkUploadedImage(jpegHeader(1600, 900))).toEqual({ format: 'jpg', width: 1600, height: 900 });
  });

  it('answers 415 for something that is not a PNG or JPEG', () => {
    expect(() => checkUploadedImage(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toThrow(expect.objectContaining({ code: 'UNSUPPORTED_IMAGE', status: 415 }));
  });
});
