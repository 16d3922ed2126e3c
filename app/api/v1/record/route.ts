import { route } from '@/lib/server/http/route';
import { download } from '@/lib/server/http/download';
import { parseRecordFormat, recordDownload } from '@/lib/server/record/export';

/** The token's workspace's threshold record, as in the app: ?format=csv | json (default json). */
export const GET = route({ auth: 'token' }, async ({ ctx, req }) =>
  download(await recordDownload(ctx, parseRecordFormat(req.nextUrl.searchParams.get('format')))),
);
