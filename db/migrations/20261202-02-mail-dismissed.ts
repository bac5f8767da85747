import type { Knex } from 'knex';

const BEFORE = `'queued', 'sending', 'sent', 'failed', 'uncertain', 'skipped'`;

/**
 * Mail that failed for good or whose delivery is uncertain is shown to managers, who send it again
 * or dismiss it: "dismissed" keeps the row (and its dedupe key, so it is never re-added) out of
 * that list, with who dismissed it and when.
 */
export async function up(knex: Knex) {
  await knex.raw('alter table mail_outbox drop constraint mail_outbox_status_check');
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_status_check check (status in (${BEFORE}, 'dismissed'))`);
  await knex.schema.alterTable('mail_outbox', (t) => {
    t.uuid('dismissed_by').references('users.id').onDelete('SET NULL');
    t.timestamp('dismissed_at', { useTz: true });
  });
  await knex.raw(`create index mail_outbox_undelivered_idx on mail_outbox (organisation_id, created_at) where status in ('failed', 'uncertain')`);
}

/** Going back forgets the dismissals: those rows count as failed again. */
export async function down(knex: Knex) {
  await knex.raw('drop index if exists mail_outbox_undelivered_idx');
  await knex('mail_outbox').where({ status: 'dismissed' }).update({ status: 'failed' });
  await knex.schema.alterTable('mail_outbox', (t) => {
    t.dropColumn('dismissed_at');
    t.dropColumn('dismissed_by');
  });
  await knex.raw('alter table mail_outbox drop constraint mail_outbox_status_check');
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_status_check check (status in (${BEFORE}))`);
}
