import 'server-only';
import { StudyAsset } from '@/entities/study-asset';
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { recordAudit } from '@/lib/server/team/audit';
import { isUuid } from '@/lib/server/platform/ids';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// Item pictures an analyst uploads for a study's trials: PNG, JPEG or WebP, at most 512 KB
// (MAX_PICTURE_BYTES; 413 beyond, checked on Content-Length before the body is read), with the
// type judged by the file's magic bytes, not the declared type (422 when not a picture). The
// bytes live in study_asset; GET /api/assets/[id] serves them publicly — the id is a random
// UUID — with immutable cache headers. Tests: tests/integration/studies-assets.test.ts.

export const MAX_PICTURE_BYTES = 512 * 1024;
export const PICTURE_TYPES = ['image/png', 'image/jpeg', 'image/webp'] as const;
type PictureType = (typeof PICTURE_TYPES)[number];

const tooLarge = () => new AppError(413, 'payload_too_large', `The picture is larger than ${MAX_PICTURE_BYTES / 1024} KB. Save it smaller (for example 800 px wide) and upload again.`);
const notPicture = (message: string) => new AppError(422, 'validation_failed', message, [{ path: 'file', message }]);

/** What the bytes really are: the declared content type alone is easy to fake. */
export function sniffPicture(b: Uint8Array): PictureType | null {
  const at = (i: number, ...v: number[]) => v.every((x, k) => b[i + k] === x);
  if (at(0, 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return 'image/png';
  if (at(0, 0xff, 0xd8, 0xff)) return 'image/jpeg';
  if (at(0, 0x52, 0x49, 0x46, 0x46) && at(8, 0x57, 0x45, 0x42, 0x50)) return 'image/webp';
  return null;
}

/** Checks the declared size before reading a multipart body, so a huge upload is refused early. */
export function checkUploadLength(contentLength: string | null) {
  // Multipart framing adds a few hundred bytes around the file.
  if (contentLength && Number(contentLength) > MAX_PICTURE_BYTES + 16 * 1024) throw tooLarge();
}

export async function savePicture(ctx: WorkspaceContext, file: unknown): Promise<{ id: string; url: string; contentType: string; byteSize: number }> {
  if (!(file instanceof Blob)) throw notPicture('Choose a picture file to upload (field “file”).');
  if (file.size > MAX_PICTURE_BYTES) throw tooLarge();
  if (file.size === 0) throw notPicture('The file is empty.');
  const declared = file.type;
  if (!(PICTURE_TYPES as readonly string[]).includes(declared)) throw notPicture('Upload a PNG, JPEG or WebP picture.');
  const bytes = new Uint8Array(await file.arrayBuffer());
  const actual = sniffPicture(bytes);
  if (!actual) throw notPicture('This file is not a PNG, JPEG or WebP picture.');
  if (actual !== declared) throw notPicture(`The file says it is ${declared} but its contents are ${actual}.`);
  const db = await em();
  const asset = db.create(StudyAsset, { workspace: ctx.workspace.id, contentType: actual, byteSize: bytes.byteLength, bytes: Buffer.from(bytes) });
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.picture_uploaded', target: asset.id, detail: { byteSize: asset.byteSize, contentType: actual } });
  return { id: asset.id, url: `/api/assets/${asset.id}`, contentType: actual, byteSize: asset.byteSize };
}

/** Public read of one picture (respondents see it; ids are random UUIDs). */
export async function readPicture(id: string): Promise<{ contentType: string; bytes: Buffer } | null> {
  if (!isUuid(id)) return null;
  const db = await em();
  const row = await sqlOne<{ content_type: string; bytes: Buffer }>(db, 'select content_type, bytes from study_asset where id = ?', [id]);
  return row ? { contentType: row.content_type, bytes: row.bytes } : null;
}
