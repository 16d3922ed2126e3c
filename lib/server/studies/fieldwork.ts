import 'server-only';
import { readDesign } from '@/lib/schemas/study.schema';
import type { StudyStateName } from '@/lib/study-states';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { ANSWERING_HOLD_MINUTES, HOLDING_SQL, START_HOLD_MINUTES, heldSeats } from '@/lib/server/billing/seat-holds';
import { loadStudy } from './studies';
import { seatBalance } from '@/lib/server/billing/seat-ledger';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// The fieldwork monitor of a live study (the overview polls it every 5 s, no-store): completes,
// respondents in progress, drop-outs (started, not completed, no answer for DROP_OUT_MINUTES),
// completes per link, test answers per base price × rung with off-ladder (adaptive) and catch
// trials counted apart, and the workspace's seats left from the seat ledger. Counted in SQL, so
// the cost follows the design, not the number of respondents. Answers are grouped by the rung
// they were drawn from (Trial.shown.rung, recorded with every answer; rows without it, such as
// imports, carry the nominal depth as their discount), never by the rounded discount shown,
// which may differ from the rung by cents; the mean discount actually shown per cell travels
// alongside (`shown`).
// Tests: tests/integration/studies-fieldwork.test.ts.

/** A respondent with no answer for this long, and not completed, counts as dropped out. */
export const DROP_OUT_MINUTES = 30;

export interface FieldworkDto {
  state: StudyStateName;
  completes: number;
  inProgress: number;
  dropOuts: number;
  targetCompletes: number;
  seatsLeft: number;
  /** Seats held and used (lib/server/billing/seat-holds.ts): see seatUse below. */
  seats: SeatUse;
  perLink: { linkId: string; source: string; completes: number; closed: boolean }[];
  basePrices: number[];
  ladder: number[];
  /** Test-trial answers per cell, rows = base prices, columns = rungs (same order as above), by the rung drawn. */
  cells: number[][];
  /** Mean discount actually shown per cell (fraction); null where no answer yet. */
  shown: (number | null)[][];
  /** Test trials at depths off the ladder (adaptive placement), per base price. */
  offLadder: number[];
  /** Catch trials per base price, kept apart: they never sit on the discount axis. */
  catchTrials: number[];
  refreshedAt: string;
}

const key = (v: number) => Number(v).toFixed(6);

// Held vs used seats (issue 13, point 4): a seat is *used* when a respondent completes, and
// *held* while a respondent is still answering (briefly after a start, then while answers keep
// coming). Shown so an analyst sees a link tying up seats before the balance runs out.
export interface SeatUse {
  /** Seats this study's completes used. */
  usedHere: number;
  /** Seats held now by this study's respondents still answering. */
  heldHere: number;
  /** Seats held now across the workspace (every live study draws on one balance). */
  heldInWorkspace: number;
  /** The hold windows, for the monitor's note. */
  holdMinutes: { start: number; answering: number };
}

async function seatUse(db: Awaited<ReturnType<typeof em>>, workspaceId: string, studyId: string, completes: number): Promise<SeatUse> {
  const row = await sqlOne<{ n: string }>(db, `select count(*) as n from respondent r where r.workspace_id = ? and r.study_id = ? and ${HOLDING_SQL}`, [workspaceId, studyId]);
  return { usedHere: completes, heldHere: Number(row?.n ?? 0), heldInWorkspace: await heldSeats(db, { workspaceId }), holdMinutes: { start: START_HOLD_MINUTES, answering: ANSWERING_HOLD_MINUTES } };
}

export async function getFieldwork(ctx: WorkspaceContext, studyId: string): Promise<FieldworkDto> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, studyId);
  const design = readDesign(study.design, study.state);
  // Last activity: the latest answer, or the start (lastSeenAt too, should the flow touch it).
  const [status] = await sql<{ completes: string; in_progress: string; drop_outs: string }>(
    db,
    `select count(*) filter (where r.state = 'completed') as completes,
            count(*) filter (where r.state = 'started' and a.last_at > now() - make_interval(mins => ?)) as in_progress,
            count(*) filter (where r.state = 'started' and a.last_at <= now() - make_interval(mins => ?)) as drop_outs
       from respondent r
       cross join lateral (select greatest(r.last_seen_at, r.started_at, (select max(t.answered_at) from trial t where t.respondent_id = r.id)) as last_at) a
      where r.study_id = ? and r.workspace_id = ?`,
    [DROP_OUT_MINUTES, DROP_OUT_MINUTES, study.id, ctx.workspace.id],
  );
  const perLink = await sql<{ id: string; source: string; closed_at: Date | null; completes: string }>(
    db,
    `select l.id, l.source, l.closed_at, count(r.id) filter (where r.state = 'completed') as completes
       from respondent_link l left join respondent r on r.link_id = l.id
      where l.study_id = ? and l.workspace_id = ? group by l.id order by l.created_at`,
    [study.id, ctx.workspace.id],
  );
  const cellRows = await sql<{ kind: string; base_price: number; rung: number; n: string; shown_sum: number }>(
    db,
    `select kind, base_price, coalesce((shown ->> 'rung')::float8, discount) as rung, count(*) as n, sum(discount) as shown_sum
       from trial where study_id = ? and kind in ('test', 'catch') group by 1, 2, 3`,
    [study.id],
  );
  const bases = design.basePrices;
  const ladder = design.ladder;
  const row = new Map(bases.map((b, i) => [key(b), i]));
  const col = new Map(ladder.map((d, i) => [key(d), i]));
  const cells = bases.map(() => ladder.map(() => 0));
  const shownSum = bases.map(() => ladder.map(() => 0));
  const offLadder = bases.map(() => 0);
  const catchTrials = bases.map(() => 0);
  for (const r of cellRows) {
    const i = row.get(key(r.base_price));
    if (i === undefined) continue;
    const n = Number(r.n);
    if (r.kind === 'catch') catchTrials[i] += n;
    else {
      const j = col.get(key(r.rung));
      if (j === undefined) offLadder[i] += n;
      else { cells[i][j] += n; shownSum[i][j] += Number(r.shown_sum); }
    }
  }
  return {
    state: study.state,
    completes: Number(status?.completes ?? 0),
    inProgress: Number(status?.in_progress ?? 0),
    dropOuts: Number(status?.drop_outs ?? 0),
    targetCompletes: design.targetCompletes,
    seatsLeft: await seatBalance(db, ctx.workspace.id),
    seats: await seatUse(db, ctx.workspace.id, study.id, Number(status?.completes ?? 0)),
    perLink: perLink.map((l) => ({ linkId: l.id, source: l.source, completes: Number(l.completes), closed: !!l.closed_at })),
    basePrices: bases,
    ladder,
    cells,
    shown: cells.map((row, i) => row.map((n, j) => (n ? Math.round((shownSum[i][j] / n) * 1e6) / 1e6 : null))),
    offLadder,
    catchTrials,
    refreshedAt: new Date().toISOString(),
  };
}
