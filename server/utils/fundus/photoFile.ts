// Uploaded fundus photographs: checked and cleaned here, stored through the photo
// storage (server/lib/storage: a private folder or bucket, never public/) under
// random names, and reached only through the authorised image route. The type is
// read from the file's own first bytes, never from its name or the declared type,
// and every file is decoded and re-encoded by sharp so that no metadata (EXIF, GPS,
// camera serials, text chunks) survives.

import { randomUUID } from 'node:crypto'
import { dirname, join, resolve } from 'node:path'
import sharp from 'sharp'

export const FUNDUS_PHOTO_MAX_BYTES = 10 * 1024 * 1024
/** Decoding refuses pictures larger than this many pixels (a decompression-bomb guard). */
const MAX_PIXELS = 60_000_000

export type FundusPhotoType = 'image/jpeg' | 'image/png'

/** JPEG starts FF D8 FF; PNG with its 8-byte signature (ISO/IEC 10918-1; ISO/IEC 15948). */
export function sniffImageType(bytes: Uint8Array): FundusPhotoType | null {
  if (bytes.length >= 3 && bytes[0] === 0xFF && bytes[1] === 0xD8 && bytes[2] === 0xFF) return 'image/jpeg'
  const png = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]
  if (bytes.length >= 8 && png.every((b, i) => bytes[i] === b)) return 'image/png'
  return null
}

export interface CleanImage {
  bytes: Buffer
  type: FundusPhotoType
  width: number
  height: number
}

/**
 * Decode and re-encode in the same format. Orientation from EXIF is applied first
 * (so the picture looks as the camera meant once the tag is gone); without
 * `withMetadata`, sharp writes no EXIF, XMP, IPTC or ICC data.
 */
export async function cleanImage(input: Uint8Array, type: FundusPhotoType): Promise<CleanImage> {
  const pipeline = sharp(input, { limitInputPixels: MAX_PIXELS, failOn: 'error' }).rotate()
  const encoded = type === 'image/jpeg' ? pipeline.jpeg({ quality: 92, mozjpeg: true }) : pipeline.png({ compressionLevel: 8 })
  const { data, info } = await encoded.toBuffer({ resolveWithObject: true })
  return { bytes: data, type, width: info.width, height: info.height }
}

/** The photo folder: NUXT_FUNDUS_PHOTO_DIR, or `fundus-photos` beside the SQLite file. */
export function fundusPhotoDirFor(config: { dbPath?: unknown, fundusPhotoDir?: unknown }): string {
  const configured = String(config.fundusPhotoDir ?? '')
  return configured ? resolve(configured) : join(dirname(resolve(String(config.dbPath))), 'fundus-photos')
}

/** A fresh random storage name with the right extension. */
export const newStorageName = (type: FundusPhotoType): string => `${randomUUID()}.${type === 'image/png' ? 'png' : 'jpg'}`

/** Only names this module made: a UUID and an extension. Guards every path join. */
export const isStorageName = (name: string): boolean => /^[0-9a-f-]{36}\.(?:jpg|png)$/.test(name)
