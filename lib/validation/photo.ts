import { z } from 'zod';
import { PHOTO_MAX_BYTES } from '@/lib/storage-keys';

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

export const presignPhotoSchema = z.strictObject({
  id: z.uuid({ version: 'v4', message: 'Must be a UUID v4 made on the device' }),
  observationId: z.uuid('Must be the id of a synced observation'),
  contentType: z.enum(PHOTO_TYPES, 'Photos must be JPEG, PNG or WebP'),
  bytes: z
    .number()
    .int()
    .positive('The photo is empty')
    .max(PHOTO_MAX_BYTES, `Photos are limited to ${PHOTO_MAX_BYTES / 1024 / 1024} MB; the app downscales them before upload`),
  takenAt: z.iso.datetime({ offset: true }).optional(),
});

export const confirmPhotoSchema = z.strictObject({ id: z.uuid() });
