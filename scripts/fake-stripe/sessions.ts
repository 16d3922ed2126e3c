// In-memory checkout sessions and events, shaped like Stripe's objects (the fields the app
// and a reader of the JSON would look for).
import { createHmac, randomBytes } from 'node:crypto';
import type { FormValue } from './form';

export interface CheckoutSession {
  id: string;
  object: 'checkout.session';
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer: null;
  customer_email: string | null;
  customer_details: { email: string | null } | null;
  expires_at: number;
  line_items_summary: { name: string; quantity: number; unit_amount: number }[];
  livemode: false;
  metadata: Record<string, string>;
  mode: string;
  payment_intent: string | null;
  payment_status: 'unpaid' | 'paid';
  status: 'open' | 'complete' | 'expired';
  success_url: string;
  url: string | null;
}

export interface StripeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: CheckoutSession };
  livemode: false;
  pending_webhooks: number;
  request: { id: null; idempotency_key: null };
  type: string;
}

export class ParamError extends Error {
  constructor(public readonly param: string, message: string, public readonly code = 'parameter_invalid') {
    super(message);
  }
}

const rid = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);
const str = (v: FormValue | undefined) => (typeof v === 'string' ? v : undefined);

export const sessions = new Map<string, CheckoutSession>();
export const events = new Map<string, StripeEvent>();

export function createSession(form: Record<string, FormValue>, publicUrl: string): CheckoutSession {
  const success = str(form.success_url);
  if (!success) throw new ParamError('success_url', 'Missing required param: success_url.', 'parameter_missing');
  const mode = str(form.mode);
  if (mode !== 'payment') throw new ParamError('mode', 'Invalid mode: this stand-in supports mode=payment only.');
  const rawItems = Array.isArray(form.line_items) ? form.line_items : [];
  if (rawItems.length === 0) throw new ParamError('line_items', 'Missing required param: line_items.', 'parameter_missing');
  let currency = '';
  const items = rawItems.map((raw, i) => {
    const item = raw as Record<string, FormValue>;
    const pd = (item.price_data ?? {}) as Record<string, FormValue>;
    const amount = Number(str(pd.unit_amount));
    const cur = str(pd.currency);
    if (!Number.isInteger(amount) || amount < 0) throw new ParamError(`line_items[${i}][price_data][unit_amount]`, 'Invalid integer: unit_amount.');
    if (!cur) throw new ParamError(`line_items[${i}][price_data][currency]`, 'Missing required param: currency.', 'parameter_missing');
    currency = cur.toLowerCase();
    const name = str(((pd.product_data ?? {}) as Record<string, FormValue>).name) ?? 'Item';
    return { name, quantity: Number(str(item.quantity) ?? 1), unit_amount: amount };
  });
  const total = items.reduce((s, i) => s + i.quantity * i.unit_amount, 0);
  const id = `cs_test_${randomBytes(45).toString('base64').replace(/[^A-Za-z0-9]/g, '').slice(0, 58)}`;
  const email = str(form.customer_email) ?? null;
  const session: CheckoutSession = {
    id,
    object: 'checkout.session',
    amount_subtotal: total,
    amount_total: total,
    cancel_url: str(form.cancel_url) ?? null,
    client_reference_id: str(form.client_reference_id) ?? null,
    created: now(),
    currency,
    customer: null,
    customer_email: email,
    customer_details: null,
    expires_at: now() + 24 * 3600,
    line_items_summary: items,
    livemode: false,
    metadata: Object.fromEntries(Object.entries((form.metadata ?? {}) as Record<string, FormValue>).map(([k, v]) => [k, String(v)])),
    mode,
    payment_intent: null,
    payment_status: 'unpaid',
    status: 'open',
    success_url: success,
    url: `${publicUrl}/checkout/${id}`,
  };
  sessions.set(id, session);
  return session;
}

/** Marks the session paid (once) and makes a new `checkout.session.completed` event for it. */
export function completeSession(session: CheckoutSession): StripeEvent {
  if (session.status !== 'complete') {
    session.status = 'complete';
    session.payment_status = 'paid';
    session.payment_intent = rid('pi');
    session.customer_details = { email: session.customer_email };
    session.url = null;
  }
  const event: StripeEvent = {
    id: rid('evt'),
    object: 'event',
    api_version: '2026-10-28.endive',
    created: now(),
    data: { object: structuredClone(session) },
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type: 'checkout.session.completed',
  };
  events.set(event.id, event);
  return event;
}

/** Stripe's scheme: `t=<unix time>,v1=<hex HMAC-SHA256(secret, "<t>.<payload>")>`. */
export function signPayload(payload: string, secret: string, timestamp = now()): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export function fillSessionId(url: string, id: string): string {
  return url.replaceAll('{CHECKOUT_SESSION_ID}', id);
}
