import { responds } from '@/lib/contracts/http';
import type { PhotoStored } from '@/lib/contracts/photos';
import { memberRoute } from '@/lib/server/http';
import { confirmPhoto } from '@/lib/server/services/photos';
import { confirmPhotoSchema } from '@/lib/validation/photo';

export const POST = memberRoute({ permission: 'record-observations', body: confirmPhotoSchema, response: responds<PhotoStored>() }, async (member, { body }) =>
  confirmPhoto(member, body.id),
);
