import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';

export const LEDGER_REASONS = ['welcome', 'purchase', 'complete', 'adjustment'] as const;

/** The seat balance is always the sum of a workspace's entries. */
export const SeatLedgerEntry = defineEntity({
  name: 'SeatLedgerEntry',
  tableName: 'seat_ledger_entry',
  uniques: [{ name: 'seat_ledger_reason_reference_unique', properties: ['reason', 'reference'] }],
  indexes: [{ properties: ['workspace', 'createdAt'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade'),
    delta: p.integer(),
    reason: p.enum([...LEDGER_REASONS]),
    /** Unique per reason: the workspace id, a checkout session id, a respondent id. */
    reference: p.string().length(120),
    note: p.string().length(200).nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type ISeatLedgerEntry = InferEntity<typeof SeatLedgerEntry>;
