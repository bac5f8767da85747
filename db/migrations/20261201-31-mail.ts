import type { Knex } from 'knex';

/**
 * Notification mail goes through this outbox, drained by a worker in every app server. A row is
 * claimed with FOR UPDATE SKIP LOCKED, marked "sending" before the SMTP call and "sent" after it;
 * dedupe_key makes each notification (a comment to a person, a task's overdue notice, a person's
 * digest of a day) a single row however many servers try to add it.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').references('organisations.id').onDelete('CASCADE');
    t.uuid('user_id').references('users.id').onDelete('CASCADE');
    t.text('to_email').notNullable();
    t.text('kind').notNullable();
    t.text('dedupe_key').notNullable().unique();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    t.jsonb('headers').notNullable().defaultTo('{}');
    t.text('status').notNullable().defaultTo('queued');
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('claimed_at', { useTz: true });
    t.timestamp('sent_at', { useTz: true });
    t.text('last_error');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id', 'created_at']);
  });
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_kind_check
    check (kind in ('assignment', 'comment', 'mention', 'overdue', 'digest'))`);
  // skipped: a digest day with nothing to say, kept so no server builds it again.
  // uncertain: the worker died mid-send; never resent automatically (see services/mail-worker.ts).
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_status_check
    check (status in ('queued', 'sending', 'sent', 'failed', 'uncertain', 'skipped'))`);
  await knex.raw(`create index mail_outbox_due_idx on mail_outbox (next_attempt_at) where status = 'queued'`);
  await knex.raw(`create index mail_outbox_sending_idx on mail_outbox (claimed_at) where status = 'sending'`);

  await knex.schema.createTable('notification_preferences', (t) => {
    t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
    t.boolean('assignment').notNullable().defaultTo(true);
    t.boolean('comment').notNullable().defaultTo(true);
    t.boolean('mention').notNullable().defaultTo(true);
    t.boolean('overdue').notNullable().defaultTo(true);
    t.boolean('digest').notNullable().defaultTo(false);
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex) {
  await knex.schema.dropTableIfExists('notification_preferences');
  await knex.schema.dropTableIfExists('mail_outbox');
}
