import { describe, expect, it } from 'vitest';
import { NextRequest } from 'next/server';
import { route, routeSpec } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { env } from '@/lib/server/platform/env';
import { em } from '@/lib/server/db/orm';
import { Invitation } from '@/entities/invitation';
import { POST as invite } from '@/app/api/w/[workspace]/invitations/route';
import { POST as webhook } from '@/app/api/stripe/webhook/route';
import { POST as uploadPicture } from '@/app/api/w/[workspace]/assets/route';
import { POST as answers } from '@/app/r/[token]/answers/route';
import { POST as start } from '@/app/r/[token]/start/route';
import { MAX_PICTURE_BYTES } from '@/lib/server/studies/assets';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { makeLiveStudy } from '../support/respondent-fixtures';

// The checks route() makes on every write before its handler runs (lib/server/http/request-guard.ts):
// no cross-site senders (issue 13, finding 2: a page on another port of the same host made an
// owner's browser invite the attacker as owner with a text/plain body), only the body types a
// route declares, and bodies bounded while they stream in (finding 3: 100 MB to the webhook
// read in full before the signature check; chunked uploads past the cap until buffered).

let ran = 0;
const probe = route({ auth: 'public', reason: 'a probe for the guard test, stores nothing' }, async ({ req }) => {
  ran++;
  return { got: (await req.text()).length };
});
const probeToken = route({ auth: 'token' }, async () => ({ ok: true }));

const post = (headers: Record<string, string>, body: BodyInit | null = '{"a":1}', handler: (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response> = probe) =>
  handler(new NextRequest('http://127.0.0.1:3000/probe', { method: 'POST', headers, body, duplex: 'half' } as never), { params: Promise.resolve({}) });

/** A body of `total` bytes that counts what the server pulled (a chunked upload: no Content-Length). */
function countingStream(total: number, chunk = 64 * 1024) {
  let pulled = 0;
  const stream = new ReadableStream<Uint8Array>({
    pull(c) {
      if (pulled >= total) return c.close();
      c.enqueue(new Uint8Array(chunk).fill(0x7b));
      pulled += chunk;
    },
  });
  return { stream, pulled: () => pulled };
}

describe('route(): writes from another site are refused before the handler runs', () => {
  it('Sec-Fetch-Site same-site (another port of this host) or cross-site: 403 cross_site', async () => {
    for (const site of ['same-site', 'cross-site']) {
      const before = ran;
      const res = await post({ 'content-type': 'application/json', 'sec-fetch-site': site, origin: 'http://127.0.0.1:8080' });
      expect(res.status, site).toBe(403);
      expect((await res.json()).error.code).toBe('cross_site');
      expect(ran).toBe(before);
    }
  });

  it('without Sec-Fetch-Site, an Origin of another port or host is refused; APP_URL or the Host itself passes', async () => {
    expect((await post({ 'content-type': 'application/json', origin: 'http://127.0.0.1:8080', host: '127.0.0.1:3000' })).status).toBe(403);
    expect((await post({ 'content-type': 'application/json', origin: 'http://evil.example', host: '127.0.0.1:3000' })).status).toBe(403);
    expect((await post({ 'content-type': 'application/json', origin: 'null', host: '127.0.0.1:3000' })).status).toBe(403);
    expect((await post({ 'content-type': 'application/json', origin: new URL(env().APP_URL).origin })).status).toBe(200);
    expect((await post({ 'content-type': 'application/json', origin: 'http://127.0.0.1:3000', host: '127.0.0.1:3000' })).status).toBe(200);
    expect((await post({ 'content-type': 'application/json', 'sec-fetch-site': 'same-origin', origin: 'http://127.0.0.1:3000' })).status).toBe(200);
    // Neither header: not a browser page, so no cookie it could have lent (Next.js's server-action rule too).
    expect((await post({ 'content-type': 'application/json' })).status).toBe(200);
  });

  it('reads are never refused for their origin; token routes and routes that declare anyOrigin are exempt', async () => {
    const get = await probe(new NextRequest('http://127.0.0.1:3000/probe', { headers: { 'sec-fetch-site': 'cross-site' } }), { params: Promise.resolve({}) });
    expect(get.status).toBe(200);
    // A bearer-token route answers 401 for the missing token, not 403 for the origin.
    expect((await post({ 'content-type': 'application/json', 'sec-fetch-site': 'cross-site' }, '{}', probeToken)).status).toBe(401);
    expect(routeSpec(webhook)?.anyOrigin).toMatch(/signature/);
  });

  it("finding 2 replayed: a same-site page's text/plain post cannot make an owner invite anyone", async () => {
    const ws = await makeWorkspace();
    signInAs(ws.owner);
    const body = JSON.stringify({ email: `attacker-${Date.now()}@evil.example`, role: 'owner' });
    const attack = await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, rawBody: body, headers: { 'content-type': 'text/plain', 'sec-fetch-site': 'same-site', origin: 'http://127.0.0.1:8080' } });
    expect(attack.status).toBe(403);
    // Even a client that hides where it came from cannot use the no-preflight text/plain type.
    const plain = await callRoute(invite, { method: 'POST', params: { workspace: ws.slug }, rawBody: body, headers: { 'content-type': 'text/plain' } });
    expect(plain.status).toBe(415);
    expect((await plain.json()).error.code).toBe('unsupported_media_type');
    const db = (await em()).fork();
    expect(await db.count(Invitation, { email: JSON.parse(body).email })).toBe(0);
  });
});

describe('route(): body types', () => {
  it('a JSON route refuses form and text bodies (415) but takes a bodiless request without a type', async () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      expect((await post({ 'content-type': type })).status, type).toBe(415);
    }
    expect((await post({}, null)).status).toBe(200);
    expect((await post({ 'content-type': 'application/json; charset=utf-8' })).status).toBe(200);
  });

  it("routes that document other types take them: the answers beacon's text/plain, the consent form's urlencoded post", async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug);
    // Refused for what they carry, not for their type: the type check passed.
    const beacon = await callRoute(answers, { method: 'POST', params: { token }, rawBody: '{"answers":[]}', headers: { 'content-type': 'text/plain;charset=UTF-8' } });
    expect(beacon.status).toBe(422);
    const form = await callRoute(start, { method: 'POST', params: { token }, rawBody: 'pid=', headers: { 'content-type': 'application/x-www-form-urlencoded', origin: new URL(env().APP_URL).origin } });
    expect(form.status).toBe(303);
    const crossForm = await callRoute(start, { method: 'POST', params: { token }, rawBody: 'pid=', headers: { 'content-type': 'application/x-www-form-urlencoded', 'sec-fetch-site': 'cross-site' } });
    expect(crossForm.status).toBe(403);
  });
});

describe('route(): bodies bounded while streaming, before parsing', () => {
  it('a declared Content-Length over the limit: 413 in the error shape, not a byte read', async () => {
    const { stream, pulled } = countingStream(50 * 1024 * 1024);
    const res = await post({ 'content-type': 'application/json', 'content-length': String(50 * 1024 * 1024) }, stream);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toMatchObject({ code: 'payload_too_large', message: expect.stringMatching(/larger than 64 kB/) });
    expect(pulled()).toBeLessThanOrEqual(64 * 1024);
  });

  it('a chunked 50 MB stream (no length): 413 once the limit is passed, the rest never read', async () => {
    const { stream, pulled } = countingStream(50 * 1024 * 1024);
    const before = ran;
    const res = await post({ 'content-type': 'application/json' }, stream);
    expect(res.status).toBe(413);
    expect(ran).toBe(before);
    // The limit plus what the stream queued ahead, not 50 MB.
    expect(pulled()).toBeLessThanOrEqual(BODY_LIMITS.json + 4 * 64 * 1024);
  });

  it('the webhook (1 MB) refuses a 100 MB chunked body before its signature check; a body at the limit is read', async () => {
    const { stream, pulled } = countingStream(100 * 1024 * 1024);
    const res = await webhook(new NextRequest('http://127.0.0.1:3000/api/stripe/webhook', { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': 't=1,v1=x' }, body: stream, duplex: 'half' } as never), { params: Promise.resolve({}) });
    expect(res.status).toBe(413);
    expect(pulled()).toBeLessThanOrEqual(BODY_LIMITS.webhook + 4 * 64 * 1024);
    const ok = await callRoute(webhook, { method: 'POST', params: {}, rawBody: '{"a":"' + 'x'.repeat(BODY_LIMITS.webhook - 16) + '"}', headers: { 'stripe-signature': 't=1,v1=x' } });
    expect(ok.status).toBe(400); // read in full, then refused for its signature
  });

  it('respondent calls take 16 kB: a 17 kB answer batch is 413', async () => {
    const ws = await makeWorkspace();
    const { token } = await makeLiveStudy(ws.slug);
    const res = await callRoute(answers, { method: 'POST', params: { token }, rawBody: JSON.stringify({ answers: [], pad: 'x'.repeat(17 * 1024) }) });
    expect(res.status).toBe(413);
  });

  it('a chunked picture upload past its documented cap is refused before it is buffered', async () => {
    const ws = await makeWorkspace();
    signInAs(ws.owner);
    const { stream, pulled } = countingStream(50 * 1024 * 1024);
    const res = await uploadPicture(
      new NextRequest('http://127.0.0.1:3000/x', { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=b' }, body: stream, duplex: 'half' } as never),
      { params: Promise.resolve({ workspace: ws.slug }) },
    );
    expect(res.status).toBe(413);
    expect(pulled()).toBeLessThanOrEqual(MAX_PICTURE_BYTES + 16 * 1024 + 4 * 64 * 1024);
  });
});

describe('route(): response headers', () => {
  it("a JSON answer (and an error) carries default-src 'none'; a handler's own policy stands", async () => {
    expect((await post({ 'content-type': 'application/json' })).headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    expect((await post({ 'content-type': 'text/plain' })).headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    const own = route({ auth: 'public', reason: 'a probe for the header test, reads nothing' }, async () => new Response('x', { headers: { 'content-security-policy': "default-src 'none'; img-src 'self'" } }));
    expect((await own(new NextRequest('http://127.0.0.1/x'), { params: Promise.resolve({}) })).headers.get('content-security-policy')).toBe("default-src 'none'; img-src 'self'");
  });
});
