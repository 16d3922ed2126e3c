import { route } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { parseRecordFormat, recordDownload } from '@/lib/server/record/export';

/** The whole threshold record as a file: ?format=csv | json (default json). */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, req }) =>
  download(await recordDownload(ctx, parseRecordFormat(req.nextUrl.searchParams.get('format')))),
);
