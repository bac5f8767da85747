import type { Knex } from 'knex';

export async function up(knex: Knex) {
  await knex.schema.createTable('organisations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('name').notNullable();
    t.text('unit_system').notNullable().defaultTo('metric');
    t.boolean('keep_photo_location').notNullable().defaultTo(false);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`alter table organisations add constraint organisations_unit_system_check
    check (unit_system in ('metric', 'imperial'))`);

  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable().unique();
    t.text('name');
    t.text('password_hash');
    t.timestamp('email_verified', { useTz: true });
    t.text('locale').notNullable().defaultTo('en');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`alter table users add constraint users_email_lower_check check (email = lower(email))`);
  await knex.raw(`alter table users add constraint users_locale_check check (locale in ('en', 'es'))`);

  await knex.schema.createTable('memberships', (t) => {
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('role').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['organisation_id', 'user_id']);
    t.index(['user_id']);
  });
  await knex.raw(`alter table memberships add constraint memberships_role_check
    check (role in ('manager', 'scout', 'pruner', 'advisor'))`);

  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('email').notNullable();
    t.text('role').notNullable();
    // Only a hash of the token is kept, so a database leak does not hand out sign-ups.
    t.text('token_hash').notNullable().unique();
    t.uuid('invited_by').references('users.id').onDelete('SET NULL');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.uuid('accepted_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id']);
  });
  await knex.raw(`alter table invitations add constraint invitations_role_check
    check (role in ('manager', 'scout', 'pruner', 'advisor'))`);

  // next-auth adapter tables (only what the e-mail provider uses).
  await knex.schema.createTable('accounts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('type').notNullable();
    t.text('provider').notNullable();
    t.text('provider_account_id').notNullable();
    t.unique(['provider', 'provider_account_id']);
  });
  await knex.schema.createTable('verification_tokens', (t) => {
    t.text('identifier').notNullable();
    t.text('token').notNullable();
    t.timestamp('expires', { useTz: true }).notNullable();
    t.primary(['identifier', 'token']);
  });

  // rate-limiter-flexible's table, created here so the app never runs DDL at request time.
  await knex.schema.createTable('rate_limits', (t) => {
    t.string('key', 255).primary();
    t.integer('points').notNullable().defaultTo(0);
    t.bigInteger('expire');
  });
}

export async function down(knex: Knex) {
  for (const table of ['rate_limits', 'verification_tokens', 'accounts', 'invitations', 'memberships', 'users', 'organisations']) {
    await knex.schema.dropTableIfExists(table);
  }
}
