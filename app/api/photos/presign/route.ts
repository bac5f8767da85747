import { memberRoute } from '@/lib/server/http';
import { presignPhoto } from '@/lib/server/services/photos';
import { presignPhotoSchema } from '@/lib/validation/photo';

export const POST = memberRoute({ permission: 'record-observations', body: presignPhotoSchema }, async (member, { body }) => presignPhoto(member, body));
