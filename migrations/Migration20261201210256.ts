import { Migration } from '@mikro-orm/migrations';

export class Migration20261201210256 extends Migration {

  override async up(): Promise<void> {
    this.addSql(`create table "rate_limit" ("key" varchar(255) not null, "points" int not null default 0, "expire" bigint null, constraint "rate_limit_pkey" primary key ("key"));`);
  }

  override async down(): Promise<void> {
    this.addSql(`drop table if exists "rate_limit" cascade;`);
  }

}
