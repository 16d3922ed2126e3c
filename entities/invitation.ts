import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';
import { ROLES } from '../lib/roles';

export const Invitation = defineEntity({
  name: 'Invitation',
  tableName: 'invitation',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    email: p.string().length(254),
    role: p.enum([...ROLES]),
    /** SHA-256 of the token sent by e-mail; the token itself is never stored. */
    tokenHash: p.string().length(64).unique(),
    invitedBy: p.manyToOne(User).nullable().deleteRule('set null'),
    expiresAt: p.datetime(),
    acceptedAt: p.datetime().nullable(),
    revokedAt: p.datetime().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IInvitation = InferEntity<typeof Invitation>;
