import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';

export const User = defineEntity({
  name: 'User',
  tableName: 'app_user',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    /** Stored lower-cased; unique. */
    email: p.string().length(254).unique(),
    name: p.string().length(120),
    passwordHash: p.string().length(100).hidden(),
    /** Bumped on password change; sessions carrying an older value are refused. */
    sessionVersion: p.integer().default(1),
    /** Set when the owner of the address followed a confirmation link (free seats wait for it). */
    emailConfirmedAt: p.datetime().nullable(),
    /** The workspace opened at sign-up, whose free seats the confirmation grants (once). */
    welcomeWorkspaceId: p.uuid().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IUser = InferEntity<typeof User>;
