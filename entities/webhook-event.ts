import { defineEntity, type InferEntity } from '@mikro-orm/core';

/** Stripe events already handled, keyed by Stripe's event id. */
export const WebhookEvent = defineEntity({
  name: 'WebhookEvent',
  tableName: 'webhook_event',
  properties: (p) => ({
    id: p.string().length(255).primary(),
    type: p.string().length(80),
    receivedAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IWebhookEvent = InferEntity<typeof WebhookEvent>;
