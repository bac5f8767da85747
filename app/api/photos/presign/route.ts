import { responds } from '@/lib/contracts/http';
import type { PresignAnswer } from '@/lib/contracts/photos';
import { memberRoute } from '@/lib/server/http';
import { presignPhoto } from '@/lib/server/services/photos';
import { presignPhotoSchema } from '@/lib/validation/photo';

export const POST = memberRoute(
  { permission: 'record-observations', body: presignPhotoSchema, response: responds<PresignAnswer>() },
  async (member, { body }) => presignPhoto(member, body),
);
