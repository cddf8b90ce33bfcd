import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { ErrorCode } from '@burrowline/shared';
import { AppError } from '../../lib/app-error';

/** The photo types we accept, told by the file's signature (its first bytes), never its name or claimed type. */
export const photoTypes: Record<string, 'jpg' | 'png' | 'webp'> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };

const LONGEST_SIDE = 2048;
const THUMBNAIL_SIDE = 480;
/** A decompression bomb (a small file that decodes to a vast image) is refused before it is decoded. */
const MAX_INPUT_PIXELS = 100_000_000;

export interface PreparedPhoto {
  contentType: string;
  extension: 'jpg' | 'png' | 'webp';
  image: Buffer;
  thumbnail: Buffer;
  width: number;
  height: number;
  checksum: string;
}

/**
 * Checks an upload is a photo by its signature and re-encodes it: turned upright, at most 2048 px on
 * its longest side, without its metadata (a phone photo's EXIF carries the farm's GPS position), plus
 * a square 480 px JPEG thumbnail. A file that claims to be a photo but is not is refused (415).
 */
export async function preparePhoto(upload: Buffer, label: string): Promise<PreparedPhoto> {
  const detected = await fileTypeFromBuffer(upload);
  const extension = detected ? photoTypes[detected.mime] : undefined;
  if (!detected || !extension) {
    const what = detected ? ` (its content is ${detected.ext.toUpperCase()})` : '';
    throw new AppError(ErrorCode.unsupportedFile, 415, `${label} is not a JPEG, PNG or WebP photo${what}`);
  }
  try {
    const upright = sharp(upload, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' })
      .rotate()
      .resize({ width: LONGEST_SIDE, height: LONGEST_SIDE, fit: 'inside', withoutEnlargement: true });
    const encoded =
      extension === 'png' ? upright.png({ compressionLevel: 9 }) : extension === 'webp' ? upright.webp({ quality: 85 }) : upright.jpeg({ quality: 85, mozjpeg: true });
    const { data, info } = await encoded.toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(data)
      .resize(THUMBNAIL_SIDE, THUMBNAIL_SIDE, { fit: 'cover', position: 'attention' })
      .flatten({ background: '#F7F3EA' })
      .jpeg({ quality: 78, mozjpeg: true })
      .toBuffer();
    return {
      contentType: detected.mime,
      extension,
      image: data,
      thumbnail,
      width: info.width,
      height: info.height,
      checksum: createHash('sha256').update(data).digest('hex'),
    };
  } catch {
    throw new AppError(ErrorCode.unsupportedFile, 415, `${label} could not be read as a photo (the file is damaged or not what it claims to be)`);
  }
}
