import { Migration } from '@mikro-orm/migrations';

export class Migration20261202140000 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "email_confirmation" ("id" uuid not null, "user_id" uuid not null, "token_hash" varchar(64) not null, "expires_at" timestamptz not null, "used_at" timestamptz null, "created_at" timestamptz not null, constraint "email_confirmation_pkey" primary key ("id"));`);
    this.addSql(`create index "email_confirmation_user_id_index" on "email_confirmation" ("user_id");`);
    this.addSql(`alter table "email_confirmation" add constraint "email_confirmation_token_hash_unique" unique ("token_hash");`);
    this.addSql(`alter table "email_confirmation" add constraint "email_confirmation_user_id_foreign" foreign key ("user_id") references "app_user" ("id") on update cascade on delete cascade;`);
    this.addSql(`alter table "app_user" add column "email_confirmed_at" timestamptz null, add column "welcome_workspace_id" uuid null;`);
    // Accounts from before confirmation existed got their free seats at sign-up already.
    this.addSql(`update "app_user" set "email_confirmed_at" = "created_at";`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "email_confirmation" cascade;`);
    this.addSql(`alter table "app_user" drop column "email_confirmed_at", drop column "welcome_workspace_id";`);
  }

}
