import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { User } from './user';

export const PasswordReset = defineEntity({
  name: 'PasswordReset',
  tableName: 'password_reset',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    user: p.manyToOne(User).deleteRule('cascade').index(),
    tokenHash: p.string().length(64).unique(),
    expiresAt: p.datetime(),
    usedAt: p.datetime().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IPasswordReset = InferEntity<typeof PasswordReset>;
