import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { User } from './user';

/** A link that proves someone reads the account's mailbox; only the token's SHA-256 is stored. */
export const EmailConfirmation = defineEntity({
  name: 'EmailConfirmation',
  tableName: 'email_confirmation',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    user: p.manyToOne(User).deleteRule('cascade').index(),
    tokenHash: p.string().length(64).unique(),
    expiresAt: p.datetime(),
    usedAt: p.datetime().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IEmailConfirmation = InferEntity<typeof EmailConfirmation>;
