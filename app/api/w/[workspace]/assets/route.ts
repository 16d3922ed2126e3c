import { reply, route } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { checkUploadLength, MAX_PICTURE_BYTES, savePicture } from '@/lib/server/studies/assets';

/** Item picture upload: multipart/form-data with one field "file". */
export const POST = route({ auth: 'member', role: 'analyst', body: { types: ['multipart/form-data'], maxBytes: MAX_PICTURE_BYTES + 16 * 1024 } }, async ({ req, ctx }) => {
  checkUploadLength(req.headers.get('content-length'));
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new AppError(400, 'bad_request', 'Send the picture as multipart/form-data with a field named “file”.');
  }
  return reply(await savePicture(ctx, form.get('file')), 201);
});
