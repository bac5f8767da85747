import { PHOTO_MAX_LONG_SIDE } from '@/lib/storage-keys';

/**
 * Downscales a camera photo on the device before it is queued: long side at most 2048 px, JPEG.
 * The browser applies the EXIF orientation while decoding, and the canvas keeps no metadata.
 */
export async function downscalePhoto(file: Blob, quality = 0.85): Promise<{ blob: Blob; width: number; height: number }> {
  const bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
  const scale = Math.min(1, PHOTO_MAX_LONG_SIDE / Math.max(bitmap.width, bitmap.height));
  const width = Math.round(bitmap.width * scale);
  const height = Math.round(bitmap.height * scale);
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  canvas.getContext('2d')!.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  const blob = await new Promise<Blob>((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('This photo could not be read'))), 'image/jpeg', quality),
  );
  return { blob, width, height };
}
