// A small local stand-in for the parts of Stripe that Notchwise uses, so development and tests
// never reach Stripe: POST /v1/checkout/sessions and GET /v1/checkout/sessions/:id (the HTTP API
// the official SDK calls), a test checkout page /checkout/:id (Pay / Cancel), and Stripe-signed
// `checkout.session.completed` webhooks to FAKE_STRIPE_WEBHOOK_URL, sent after
// FAKE_STRIPE_WEBHOOK_DELAY_MS and retried a few times. Test-only endpoints:
// POST /_test/checkout/sessions/:id/complete[?deliver=1] returns a new signed event (delivered
// too with deliver=1); POST /_test/events/:id/resend sends an event again (replay tests).
// Run by `npm start` (STRIPE_FAKE_PORT, 12111) and the test app (TEST_STRIPE_PORT, 12112) via
// scripts/lib/services.mjs; by hand: `tsx scripts/fake-stripe/server.ts` (loopback only).
import http from 'node:http';
import { parseStripeForm } from './form';
import { checkoutPage } from './page';
import { completeSession, createSession, events, fillSessionId, ParamError, sessions, signPayload, type StripeEvent } from './sessions';

const PORT = Number(process.env.FAKE_STRIPE_PORT ?? 12111);
const PUBLIC_URL = process.env.FAKE_STRIPE_PUBLIC_URL ?? `http://127.0.0.1:${PORT}`;
const WEBHOOK_URL = process.env.FAKE_STRIPE_WEBHOOK_URL ?? '';
const SECRET = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_local_fake_secret';
// Stripe delivers webhooks asynchronously; a short pause lets the success page show its wait.
const DELAY_MS = Number(process.env.FAKE_STRIPE_WEBHOOK_DELAY_MS ?? 1000);

type Res = http.ServerResponse;
const json = (res: Res, status: number, body: unknown) => {
  res.writeHead(status, { 'content-type': 'application/json', 'request-id': `req_${Date.now().toString(36)}` });
  res.end(JSON.stringify(body));
};
const stripeError = (res: Res, status: number, message: string, extra: Record<string, string> = {}) =>
  json(res, status, { error: { type: 'invalid_request_error', message, ...extra } });
const redirect = (res: Res, to: string) => {
  res.writeHead(303, { location: to });
  res.end();
};

async function readBody(req: http.IncomingMessage): Promise<string> {
  let body = '';
  for await (const chunk of req) body += chunk;
  return body;
}

/** Sends one event, signed the way Stripe signs, retrying a few times like Stripe does. */
async function deliver(event: StripeEvent, attempts = 3): Promise<number> {
  if (!WEBHOOK_URL) return 0;
  const payload = JSON.stringify(event, null, 2);
  for (let i = 1; ; i += 1) {
    try {
      const r = await fetch(WEBHOOK_URL, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signPayload(payload, SECRET) }, body: payload });
      log(`webhook ${event.type} ${event.id} → ${r.status}`);
      if (r.ok || i >= attempts) return r.status;
    } catch (err) {
      log(`webhook ${event.id} failed: ${(err as Error).message}`);
      if (i >= attempts) return 0;
    }
    await new Promise((r) => setTimeout(r, 500 * i));
  }
}

function log(line: string) {
  if (!process.env.FAKE_STRIPE_QUIET) process.stdout.write(`${line}\n`);
}

const authorised = (req: http.IncomingMessage) => /^Bearer sk_(test|live)_\S+$/.test(req.headers.authorization ?? '');

async function handle(req: http.IncomingMessage, res: Res) {
  const url = new URL(req.url ?? '/', PUBLIC_URL);
  const p = url.pathname;
  const m = (re: RegExp) => p.match(re);
  let hit: RegExpMatchArray | null;

  if (p.startsWith('/v1/') && !authorised(req)) return stripeError(res, 401, 'Invalid API Key provided.', { code: 'api_key_invalid' });

  if (req.method === 'POST' && p === '/v1/checkout/sessions') {
    try {
      return json(res, 200, createSession(parseStripeForm(await readBody(req)), PUBLIC_URL));
    } catch (err) {
      if (err instanceof ParamError) return stripeError(res, 400, err.message, { param: err.param, code: err.code });
      throw err;
    }
  }
  if (req.method === 'GET' && (hit = m(/^\/v1\/checkout\/sessions\/([\w-]+)$/))) {
    const s = sessions.get(hit[1]);
    return s ? json(res, 200, s) : stripeError(res, 404, `No such checkout.session: '${hit[1]}'`, { code: 'resource_missing', param: 'id' });
  }
  if (req.method === 'GET' && (hit = m(/^\/checkout\/([\w-]+)$/))) {
    const s = sessions.get(hit[1]);
    res.writeHead(s ? 200 : 404, { 'content-type': 'text/html; charset=utf-8' });
    return res.end(s ? checkoutPage(s) : '<!doctype html><p>No such checkout.</p>');
  }
  if (req.method === 'POST' && (hit = m(/^\/checkout\/([\w-]+)\/(pay|cancel)$/))) {
    const s = sessions.get(hit[1]);
    if (!s) return stripeError(res, 404, 'No such checkout.');
    if (hit[2] === 'cancel') return redirect(res, s.cancel_url ?? PUBLIC_URL);
    if (s.status === 'open') {
      const event = completeSession(s);
      setTimeout(() => void deliver(event), DELAY_MS);
    }
    return redirect(res, fillSessionId(s.success_url, s.id));
  }

  // Test-only helpers: complete a session and get (or deliver) its event; re-send an event.
  if (req.method === 'POST' && (hit = m(/^\/_test\/checkout\/sessions\/([\w-]+)\/complete$/))) {
    const s = sessions.get(hit[1]);
    if (!s) return stripeError(res, 404, 'No such checkout.session.');
    const event = completeSession(s);
    const payload = JSON.stringify(event);
    const delivered = url.searchParams.get('deliver') === '1' ? await deliver(event, 1) : null;
    return json(res, 200, { event_id: event.id, payload, signature: signPayload(payload, SECRET), delivered });
  }
  if (req.method === 'POST' && (hit = m(/^\/_test\/events\/([\w-]+)\/resend$/))) {
    const e = events.get(hit[1]);
    return e ? json(res, 200, { delivered: await deliver(e, 1) }) : stripeError(res, 404, 'No such event.');
  }
  if (p === '/health') return json(res, 200, { ok: true });
  return stripeError(res, 404, `Unrecognized request URL (${req.method}: ${p}).`);
}

const server = http.createServer((req, res) => {
  handle(req, res).catch((err) => {
    log(`error: ${(err as Error).stack}`);
    if (!res.headersSent) json(res, 500, { error: { type: 'api_error', message: 'The stand-in failed.' } });
  });
});
server.listen(PORT, '127.0.0.1', () => log(`fake Stripe listening on ${PUBLIC_URL} (webhooks → ${WEBHOOK_URL || 'nowhere'})`));
for (const sig of ['SIGINT', 'SIGTERM'] as const) process.on(sig, () => server.close(() => process.exit(0)));
