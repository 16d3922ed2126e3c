import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';

export const AuditEvent = defineEntity({
  name: 'AuditEvent',
  tableName: 'audit_event',
  indexes: [{ properties: ['workspace', 'createdAt'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).nullable().deleteRule('cascade'),
    actor: p.manyToOne(User).nullable().deleteRule('set null'),
    /** e.g. "auth.sign_in", "member.role_changed", "study.launched", "billing.purchase". */
    action: p.string().length(64),
    /** What it acted on, in words or as an id. */
    target: p.string().length(200).nullable(),
    detail: p.json<Record<string, unknown>>().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IAuditEvent = InferEntity<typeof AuditEvent>;
