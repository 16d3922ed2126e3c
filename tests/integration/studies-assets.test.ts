import { beforeAll, describe, expect, it } from 'vitest';
import { NextRequest } from 'next/server';
import { POST as uploadPOST } from '@/app/api/w/[workspace]/assets/route';
import { GET as assetGET } from '@/app/api/assets/[id]/route';
import { POST as createPOST } from '@/app/api/w/[workspace]/studies/route';
import { em } from '@/lib/server/db/orm';
import { StudyAsset } from '@/entities/study-asset';
import { MAX_PICTURE_BYTES } from '@/lib/server/studies/assets';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { TINY_PNG, validDesign } from '../support/study-fixtures';

function upload(slug: string, bytes: Uint8Array, type: string, field = 'file') {
  const form = new FormData();
  form.append(field, new Blob([new Uint8Array(bytes)], { type }), 'item.png');
  const req = new NextRequest('http://127.0.0.1/upload', { method: 'POST', body: form });
  return uploadPOST(req, { params: Promise.resolve({ workspace: slug }) });
}

describe('item picture upload and public serving', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  const count = async () => (await em()).count(StudyAsset, { workspace: { slug: ws.slug } });
  beforeAll(async () => {
    ws = await makeWorkspace();
    signInAs(await makeMember(ws.slug, 'analyst'));
  });

  it('stores a PNG and serves the same bytes publicly with long cache headers', async () => {
    const res = await upload(ws.slug, TINY_PNG, 'image/png');
    expect(res.status).toBe(201);
    const { id, url } = await res.json();
    expect(url).toBe(`/api/assets/${id}`);
    signInAs(null);
    const got = await assetGET(new Request(`http://127.0.0.1${url}`), { params: Promise.resolve({ id }) });
    expect(got.status).toBe(200);
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(got.headers.get('cache-control')).toMatch(/max-age=31536000/);
    expect(Buffer.from(await got.arrayBuffer()).equals(TINY_PNG)).toBe(true);
    signInAs(await makeMember(ws.slug, 'analyst'));
    // The study may refer to it.
    expect((await callRoute(createPOST, { method: 'POST', params: { workspace: ws.slug }, body: validDesign({ itemPictureId: id }) })).status).toBe(201);
  });

  it('a picture over 512 KB is a 413 with a clear message, nothing stored', async () => {
    const before = await count();
    const big = new Uint8Array(MAX_PICTURE_BYTES + 1);
    big.set(TINY_PNG);
    const res = await upload(ws.slug, big, 'image/png');
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toMatch(/larger than 512 KB/);
    expect(await count()).toBe(before);
  });

  it('text called image/png (magic bytes checked) and a PDF are 422 on field "file"', async () => {
    const before = await count();
    for (const [bytes, type] of [[Buffer.from('hello, not a picture'), 'image/png'], [Buffer.from('%PDF-1.7 ...'), 'application/pdf']] as const) {
      const res = await upload(ws.slug, bytes, type);
      expect(res.status).toBe(422);
      expect((await res.json()).error.issues[0].path).toBe('file');
    }
    const mislabeled = await upload(ws.slug, TINY_PNG, 'image/jpeg');
    expect(mislabeled.status).toBe(422);
    expect(await count()).toBe(before);
  });

  it('a missing file field is a 422; an unknown asset a 404', async () => {
    expect((await upload(ws.slug, TINY_PNG, 'image/png', 'picture')).status).toBe(422);
    const res = await assetGET(new Request('http://127.0.0.1/x'), { params: Promise.resolve({ id: '00000000-0000-4000-8000-000000000000' }) });
    expect(res.status).toBe(404);
  });

  it('viewers cannot upload', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    expect((await upload(ws.slug, TINY_PNG, 'image/png')).status).toBe(403);
  });
});
