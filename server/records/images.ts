// Photos as they arrive from a tablet: recognised by their bytes (file-type), never by their
// name or declared type; decoded and written again by sharp as JPEG, which applies the camera's
// orientation and keeps no metadata (sharp drops EXIF, GPS, XMP and ICC unless asked to keep
// them), so no location or camera data is stored; plus a small preview for lists.

/** Types a photo may arrive in (what the tablets' cameras and browsers send; HEIC is converted by the browser). */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
/** Longest side of the stored photo and of its preview, px. */
export const PHOTO_SIDE = 2048;
export const PREVIEW_SIDE = 320;
/** Decoding refuses images of more pixels than this (a 50-megapixel camera fits; a decompression bomb does not). */
export const MAX_INPUT_PIXELS = 60_000_000;

export class ImageRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ImageRefused';
  }
}

export interface PreparedPhoto {
  contentType: 'image/jpeg';
  data: Buffer;
  width: number;
  height: number;
  preview: Buffer;
}

/** Checks and re-encodes one upload; throws ImageRefused with a message for the person. */
export async function preparePhoto(input: Buffer, name: string): Promise<PreparedPhoto> {
  // Loaded on the first photo, not at start: the image libraries hold tens of MB a server without
  // records never needs.
  const [{ fileTypeFromBuffer }, { default: sharp }] = await Promise.all([import('file-type'), import('sharp')]);
  const type = await fileTypeFromBuffer(input);
  if (!type || !(PHOTO_TYPES as readonly string[]).includes(type.mime)) {
    throw new ImageRefused(`${name || 'the file'} is not a JPEG, PNG or WebP image${type ? ` (its content is ${type.mime})` : ''}, whatever its name says`);
  }
  try {
    const base = () => sharp(input, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).rotate();
    const full = await base()
      .resize({ width: PHOTO_SIDE, height: PHOTO_SIDE, fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 85, mozjpeg: false })
      .toBuffer({ resolveWithObject: true });
    const preview = await sharp(full.data).resize({ width: PREVIEW_SIDE, height: PREVIEW_SIDE, fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 70 }).toBuffer();
    return { contentType: 'image/jpeg', data: full.data, width: full.info.width, height: full.info.height, preview };
  } catch (e) {
    throw new ImageRefused(`${name || 'the file'} cannot be read as an image (${(e as Error).message.split('\n')[0]})`);
  }
}
