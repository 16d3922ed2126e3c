import { Migration } from '@mikro-orm/migrations';

// Respondents' data and seats (issue 13, points 4, 5 and 7):
// - respondent.reference_code: the short code a respondent sees on the thank-you screen, by which
//   an analyst deletes that respondent on request (unique per workspace; null for imported and
//   simulated respondents, who never see a thank-you screen);
// - study.retention_days: the retention frozen at launch (what the consent screen promised);
//   studies launched before this migration take their workspace's current setting;
// - study.purged_at: when the daily purge deleted the study's respondents;
// - respondent_link.pid_secret: the key a panel signs its ids with (?pid=…&sig=…), when set;
// - a partial index for the seat decision: the respondents of a workspace still holding a seat
//   (started, recently seen) are found without reading every respondent of the workspace.
export class Migration20261202150000 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`alter table "respondent" add column "reference_code" varchar(16) null;`);
    this.addSql(`create unique index "respondent_workspace_reference_unique" on "respondent" ("workspace_id", "reference_code") where "reference_code" is not null;`);
    this.addSql(`create index "respondent_holding_index" on "respondent" ("workspace_id", "last_seen_at") where "state" = 'started';`);
    this.addSql(`create index "respondent_link_holding_index" on "respondent" ("link_id", "last_seen_at") where "state" = 'started';`);
    this.addSql(`alter table "study" add column "retention_days" int null, add column "purged_at" timestamptz null;`);
    this.addSql(`update "study" s set "retention_days" = w."retention_days" from "workspace" w where w."id" = s."workspace_id" and s."launched_at" is not null;`);
    this.addSql(`alter table "respondent_link" add column "pid_secret" varchar(64) null;`);
  }

  override async down(): Promise<void> {
    this.addSql(`alter table "respondent_link" drop column "pid_secret";`);
    this.addSql(`alter table "study" drop column "retention_days", drop column "purged_at";`);
    this.addSql(`drop index if exists "respondent_link_holding_index";`);
    this.addSql(`drop index if exists "respondent_holding_index";`);
    this.addSql(`drop index if exists "respondent_workspace_reference_unique";`);
    this.addSql(`alter table "respondent" drop column "reference_code";`);
  }

}
