import { memberRoute } from '@/lib/server/http';
import { confirmPhoto } from '@/lib/server/services/photos';
import { confirmPhotoSchema } from '@/lib/validation/photo';

export const POST = memberRoute({ permission: 'record-observations', body: confirmPhotoSchema }, async (member, { body }) => confirmPhoto(member, body.id));
