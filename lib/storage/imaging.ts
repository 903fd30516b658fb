import 'server-only';
import sharp, { type Sharp } from 'sharp';
import { THUMB_MAX_PX, type ImageType } from './schema';

/** The longest side kept for the full image; larger photos are scaled down. */
const MAX_SIDE_PX = 2560;
/** Refuse to decode more pixels than this (a small file can expand to gigabytes). */
const MAX_INPUT_PIXELS = 50_000_000;

export interface CleanImage {
  image: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
}

function encode(pipeline: Sharp, type: ImageType): Sharp {
  if (type === 'image/png') return pipeline.png();
  if (type === 'image/webp') return pipeline.webp({ quality: 82 });
  return pipeline.jpeg({ quality: 85, mozjpeg: true });
}

/**
 * Decodes and re-encodes in the same format. `rotate()` bakes the camera's orientation into the pixels;
 * sharp writes no metadata unless asked, so EXIF (GPS, camera serials), XMP and comments are dropped.
 * Throws when the bytes do not decode.
 */
export async function cleanImage(input: Buffer, type: ImageType): Promise<CleanImage> {
  const decoded = sharp(input, { failOn: 'error', limitInputPixels: MAX_INPUT_PIXELS, pages: 1 })
    .rotate()
    .resize({ width: MAX_SIDE_PX, height: MAX_SIDE_PX, fit: 'inside', withoutEnlargement: true });
  const { data: image, info } = await encode(decoded, type).toBuffer({ resolveWithObject: true });
  const thumb = await encode(sharp(image).resize({ width: THUMB_MAX_PX, height: THUMB_MAX_PX, fit: 'inside', withoutEnlargement: true }), type).toBuffer();
  return { image, thumb, width: info.width, height: info.height };
}
