import { Migration } from '@mikro-orm/migrations';

export class Migration20261201202700 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "app_user" ("id" uuid not null, "email" varchar(254) not null, "name" varchar(120) not null, "password_hash" varchar(100) not null, "session_version" int not null default 1, "created_at" timestamptz not null, constraint "app_user_pkey" primary key ("id"));`);
    this.addSql(`alter table "app_user" add constraint "app_user_email_unique" unique ("email");`);

    this.addSql(`create table "password_reset" ("id" uuid not null, "user_id" uuid not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "used_at" timestamptz null, "created_at" timestamptz not null, constraint "password_reset_pkey" primary key ("id"));`);
    this.addSql(`create index "password_reset_user_id_index" on "password_reset" ("user_id");`);
    this.addSql(`alter table "password_reset" add constraint "password_reset_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "webhook_event" ("id" varchar(255) not null, "type" varchar(80) not null, "received_at" timestamptz not null, constraint "webhook_event_pkey" primary key ("id"));`);

    this.addSql(`create table "workspace" ("id" uuid not null, "slug" varchar(64) not null, "name" varchar(120) not null, "retention_days" int not null default 365, "created_at" timestamptz not null, constraint "workspace_pkey" primary key ("id"));`);
    this.addSql(`alter table "workspace" add constraint "workspace_slug_unique" unique ("slug");`);

    this.addSql(`create table "study_asset" ("id" uuid not null, "workspace_id" uuid not null, "content_type" varchar(64) not null, "byte_size" int not null, "bytes" bytea not null, "created_at" timestamptz not null, constraint "study_asset_pkey" primary key ("id"));`);
    this.addSql(`create index "study_asset_workspace_id_index" on "study_asset" ("workspace_id");`);

    this.addSql(`create table "study" ("id" uuid not null, "workspace_id" uuid not null, "name" varchar(160) not null, "state" text check ("state" in ('draft', 'live', 'paused', 'closed', 'imported')) not null default 'draft', "design" jsonb not null, "exclusion_rules" jsonb null, "data_version" int not null default 0, "copied_from" uuid null, "created_by_id" uuid null, "created_at" timestamptz not null, "updated_at" timestamptz not null, "launched_at" timestamptz null, "closed_at" timestamptz null, constraint "study_pkey" primary key ("id"));`);
    this.addSql(`create index "study_workspace_id_state_index" on "study" ("workspace_id", "state");`);

    this.addSql(`create table "analysis_result" ("id" uuid not null, "study_id" uuid not null, "kind" varchar(32) not null, "cache_key" varchar(64) not null, "data_version" int not null, "status" text check ("status" in ('queued', 'running', 'done', 'failed')) not null default 'queued', "result" jsonb null, "error" text null, "created_at" timestamptz not null, "updated_at" timestamptz not null, constraint "analysis_result_pkey" primary key ("id"));`);
    this.addSql(`alter table "analysis_result" add constraint "analysis_result_cache_unique" unique ("study_id", "kind", "cache_key");`);

    this.addSql(`create table "seat_ledger_entry" ("id" uuid not null, "workspace_id" uuid not null, "delta" int not null, "reason" text check ("reason" in ('welcome', 'purchase', 'complete', 'adjustment')) not null, "reference" varchar(120) not null, "note" varchar(200) null, "created_at" timestamptz not null, constraint "seat_ledger_entry_pkey" primary key ("id"));`);
    this.addSql(`create index "seat_ledger_entry_workspace_id_created_at_index" on "seat_ledger_entry" ("workspace_id", "created_at");`);
    this.addSql(`alter table "seat_ledger_entry" add constraint "seat_ledger_reason_reference_unique" unique ("reason", "reference");`);

    this.addSql(`create table "respondent_link" ("id" uuid not null, "workspace_id" uuid not null, "study_id" uuid not null, "token" varchar(64) not null, "source" varchar(80) not null, "quota" int null, "accepts_pid" boolean not null default false, "closed_at" timestamptz null, "created_at" timestamptz not null, constraint "respondent_link_pkey" primary key ("id"));`);
    this.addSql(`create index "respondent_link_study_id_index" on "respondent_link" ("study_id");`);
    this.addSql(`alter table "respondent_link" add constraint "respondent_link_token_unique" unique ("token");`);

    this.addSql(`create table "respondent" ("id" uuid not null, "workspace_id" uuid not null, "study_id" uuid not null, "link_id" uuid null, "pid" varchar(120) null, "resume_token" varchar(64) not null, "external_ref" varchar(120) null, "seed" int not null, "state" text check ("state" in ('started', 'completed', 'imported')) not null default 'started', "segment_answers" jsonb not null default '{}', "attention_passed" boolean null, "plan" jsonb null, "answered_count" int not null default 0, "started_at" timestamptz not null, "last_seen_at" timestamptz not null, "completed_at" timestamptz null, constraint "respondent_pkey" primary key ("id"));`);
    this.addSql(`create index "respondent_workspace_id_index" on "respondent" ("workspace_id");`);
    this.addSql(`create index "respondent_link_id_index" on "respondent" ("link_id");`);
    this.addSql(`alter table "respondent" add constraint "respondent_resume_token_unique" unique ("resume_token");`);
    this.addSql(`create index "respondent_study_id_state_index" on "respondent" ("study_id", "state");`);
    this.addSql(`alter table "respondent" add constraint "respondent_study_pid_unique" unique ("study_id", "pid");`);

    this.addSql(`create table "trial" ("id" bigserial primary key, "study_id" uuid not null, "respondent_id" uuid not null, "idx" int not null, "kind" text check ("kind" in ('practice', 'test', 'catch', 'attention')) not null, "base_price" double precision not null, "discount" double precision not null, "shown" jsonb null, "answer" smallint not null, "response_ms" int not null, "client_id" uuid not null, "answered_at" timestamptz not null);`);
    this.addSql(`create index "trial_study_cell_index" on "trial" ("study_id", "base_price", "discount");`);
    this.addSql(`alter table "trial" add constraint "trial_respondent_idx_unique" unique ("respondent_id", "idx");`);
    this.addSql(`alter table "trial" add constraint "trial_respondent_client_unique" unique ("respondent_id", "client_id");`);

    this.addSql(`create table "purchase" ("id" uuid not null, "workspace_id" uuid not null, "buyer_id" uuid null, "bundle" varchar(40) not null, "seats" int not null, "amount_cents" int not null, "currency" varchar(3) not null, "checkout_session_id" varchar(255) not null, "status" text check ("status" in ('pending', 'paid', 'canceled')) not null default 'pending', "created_at" timestamptz not null, "paid_at" timestamptz null, constraint "purchase_pkey" primary key ("id"));`);
    this.addSql(`create index "purchase_workspace_id_index" on "purchase" ("workspace_id");`);
    this.addSql(`alter table "purchase" add constraint "purchase_checkout_session_id_unique" unique ("checkout_session_id");`);

    this.addSql(`create table "price_list" ("id" uuid not null, "workspace_id" uuid not null, "name" varchar(160) not null, "currency" varchar(3) not null, "item_count" int not null, "created_by_id" uuid null, "created_at" timestamptz not null, constraint "price_list_pkey" primary key ("id"));`);
    this.addSql(`create index "price_list_workspace_id_index" on "price_list" ("workspace_id");`);

    this.addSql(`create table "promo_plan" ("id" uuid not null, "workspace_id" uuid not null, "price_list_id" uuid not null, "study_id" uuid not null, "name" varchar(160) not null, "settings" jsonb not null, "fit_version" int not null, "exclusion_rules" jsonb null, "fit" jsonb not null, "poor_fit" boolean not null default false, "created_by_id" uuid null, "created_at" timestamptz not null, constraint "promo_plan_pkey" primary key ("id"));`);
    this.addSql(`create index "promo_plan_workspace_id_index" on "promo_plan" ("workspace_id");`);

    this.addSql(`create table "price_list_item" ("id" bigserial primary key, "price_list_id" uuid not null, "row" int not null, "sku" varchar(64) not null, "name" varchar(200) not null, "regular_price" double precision not null, "unit_cost" double precision null, "category" varchar(120) null);`);
    this.addSql(`alter table "price_list_item" add constraint "price_list_item_sku_unique" unique ("price_list_id", "sku");`);

    this.addSql(`create table "membership" ("id" uuid not null, "workspace_id" uuid not null, "user_id" uuid not null, "role" text check ("role" in ('viewer', 'analyst', 'owner')) not null, "created_at" timestamptz not null, constraint "membership_pkey" primary key ("id"));`);
    this.addSql(`create index "membership_user_id_index" on "membership" ("user_id");`);
    this.addSql(`alter table "membership" add constraint "membership_workspace_id_user_id_unique" unique ("workspace_id", "user_id");`);

    this.addSql(`create table "invitation" ("id" uuid not null, "workspace_id" uuid not null, "email" varchar(254) not null, "role" text check ("role" in ('viewer', 'analyst', 'owner')) not null, "token_hash" varchar(64) not null, "invited_by_id" uuid null, "expires_at" timestamptz not null, "accepted_at" timestamptz null, "revoked_at" timestamptz null, "created_at" timestamptz not null, constraint "invitation_pkey" primary key ("id"));`);
    this.addSql(`create index "invitation_workspace_id_index" on "invitation" ("workspace_id");`);
    this.addSql(`alter table "invitation" add constraint "invitation_token_hash_unique" unique ("token_hash");`);

    this.addSql(`create table "audit_event" ("id" uuid not null, "workspace_id" uuid null, "actor_id" uuid null, "action" varchar(64) not null, "target" varchar(200) null, "detail" jsonb null, "created_at" timestamptz not null, constraint "audit_event_pkey" primary key ("id"));`);
    this.addSql(`create index "audit_event_workspace_id_created_at_index" on "audit_event" ("workspace_id", "created_at");`);

    this.addSql(`create table "api_token" ("id" uuid not null, "workspace_id" uuid not null, "user_id" uuid not null, "name" varchar(80) not null, "token_hash" varchar(64) not null, "prefix" varchar(16) not null, "created_at" timestamptz not null, "last_used_at" timestamptz null, "revoked_at" timestamptz null, constraint "api_token_pkey" primary key ("id"));`);
    this.addSql(`create index "api_token_workspace_id_index" on "api_token" ("workspace_id");`);
    this.addSql(`alter table "api_token" add constraint "api_token_token_hash_unique" unique ("token_hash");`);

    this.addSql(`alter table "password_reset" add constraint "password_reset_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "study_asset" add constraint "study_asset_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "study" add constraint "study_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "study" add constraint "study_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "analysis_result" add constraint "analysis_result_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "seat_ledger_entry" add constraint "seat_ledger_entry_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "respondent_link" add constraint "respondent_link_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "respondent_link" add constraint "respondent_link_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "respondent" add constraint "respondent_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "respondent" add constraint "respondent_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "respondent" add constraint "respondent_link_id_foreign" foreign key ("link_id") references "respondent_link" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "trial" add constraint "trial_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "trial" add constraint "trial_respondent_id_foreign" foreign key ("respondent_id") references "respondent" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "purchase" add constraint "purchase_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "purchase" add constraint "purchase_buyer_id_foreign" foreign key ("buyer_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "price_list" add constraint "price_list_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "price_list" add constraint "price_list_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "promo_plan" add constraint "promo_plan_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "promo_plan" add constraint "promo_plan_price_list_id_foreign" foreign key ("price_list_id") references "price_list" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "promo_plan" add constraint "promo_plan_study_id_foreign" foreign key ("study_id") references "study" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "promo_plan" add constraint "promo_plan_created_by_id_foreign" foreign key ("created_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "price_list_item" add constraint "price_list_item_price_list_id_foreign" foreign key ("price_list_id") references "price_list" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "membership" add constraint "membership_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "membership" add constraint "membership_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);

    this.addSql(`alter table "invitation" add constraint "invitation_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "invitation" add constraint "invitation_invited_by_id_foreign" foreign key ("invited_by_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "audit_event" add constraint "audit_event_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "audit_event" add constraint "audit_event_actor_id_foreign" foreign key ("actor_id") references "app_user" ("id") on update cascade on delete set null;`);

    this.addSql(`alter table "api_token" add constraint "api_token_workspace_id_foreign" foreign key ("workspace_id") references "workspace" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "api_token" add constraint "api_token_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);
  }

}
