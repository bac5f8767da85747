/** Photo uploads: what /api/photos/presign and /api/photos/confirm answer (the photo log is in ./grid). */

/** Already stored (a retry), or a link to PUT the bytes straight to object storage. */
export type PresignAnswer = { id: string; status: 'stored' } | { id: string; status: 'pending'; uploadUrl: string; headers: { 'content-type': string } };

export interface PhotoStored {
  id: string;
  status: 'stored';
  bytes: number;
  width: number | null;
  height: number | null;
  sha256: string | null;
}
