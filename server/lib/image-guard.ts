/**
 * Images people upload (the shop logo) are checked from their header before anything decodes
 * them: a small file can claim enormous dimensions, and decoding it would take seconds and
 * gigabytes (a decompression bomb). `image-size` reads only the header.
 */
import { imageSize } from 'image-size';
import { AppError } from './errors';

/** Largest logo we accept or ever decode: 2000 × 2000 px and 4 megapixels. */
export const IMAGE_LIMITS = { maxSide: 2000, maxPixels: 4_000_000 } as const;

export interface ImageInfo {
  format: 'png' | 'jpg';
  width: number;
  height: number;
}

/** Reads format and dimensions from the header; null for anything that is not a readable PNG or JPEG. */
export function readImageHeader(bytes: Uint8Array): ImageInfo | null {
  try {
    const { type, width, height } = imageSize(bytes);
    if ((type !== 'png' && type !== 'jpg') || !width || !height) return null;
    return { format: type, width, height };
  } catch {
    return null;
  }
}

/** True when an image of these dimensions may be decoded (reports skip a stored logo that is not). */
export function withinImageLimits(info: Pick<ImageInfo, 'width' | 'height'>, limits = IMAGE_LIMITS): boolean {
  return info.width <= limits.maxSide && info.height <= limits.maxSide && info.width * info.height <= limits.maxPixels;
}

/** The upload check: a PNG or JPEG within the limits, or a clear 415/422 error. */
export function checkUploadedImage(bytes: Uint8Array, limits = IMAGE_LIMITS): ImageInfo {
  const info = readImageHeader(bytes);
  if (!info) throw new AppError('UNSUPPORTED_IMAGE', 'The logo must be a PNG or JPEG image', 415);
  if (!withinImageLimits(info, limits)) {
    throw new AppError('IMAGE_TOO_LARGE', `The image is ${info.width} × ${info.height} px; the largest allowed is ${limits.maxSide} × ${limits.maxSide} px and ${limits.maxPixels / 1_000_000} megapixels. Scale it down and upload it again.`, 422, {
      width: info.width,
      height: info.height,
      ...limits,
    });
  }
  return info;
}
