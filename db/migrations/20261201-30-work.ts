import type { Knex } from 'knex';

/**
 * Flags, tasks and comments: findings turned into work and conversation. Flags and task updates are
 * made in the field, so their ids come from the device and payload_sha256 tells a retry from a
 * conflict, as for observations. A task belongs to one block; its items are the vines to work, in
 * walking order, each checked off on its own.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('tasks', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    t.text('title').notNullable();
    t.text('note').notNullable().defaultTo('');
    t.uuid('assignee_id').references('users.id').onDelete('SET NULL');
    t.timestamp('assigned_at', { useTz: true });
    t.date('due_on');
    t.text('priority').notNullable().defaultTo('normal');
    t.text('status').notNullable().defaultTo('open');
    t.uuid('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('closed_at', { useTz: true });
    t.index(['organisation_id', 'status', 'due_on']);
    t.index(['assignee_id', 'status']);
    t.index(['block_id']);
  });
  await knex.raw(`alter table tasks add constraint tasks_priority_check check (priority in ('low', 'normal', 'high'))`);
  await knex.raw(`alter table tasks add constraint tasks_status_check check (status in ('open', 'done', 'cancelled'))`);

  await knex.schema.createTable('flags', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('block_id').notNullable().references('blocks.id').onDelete('CASCADE');
    // The first vine of the run; a run stays within one row.
    t.uuid('position_id').notNullable().references('vine_positions.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.integer('position').notNullable();
    t.integer('to_position').notNullable();
    t.text('reason').notNullable();
    t.text('note').notNullable().defaultTo('');
    t.timestamp('flagged_at', { useTz: true }).notNullable();
    t.uuid('flagged_by').references('users.id').onDelete('SET NULL');
    t.text('status').notNullable().defaultTo('open');
    t.timestamp('closed_at', { useTz: true });
    t.uuid('closed_by').references('users.id').onDelete('SET NULL');
    // The open task working this flag; cleared when that task is cancelled.
    t.uuid('task_id').references('tasks.id').onDelete('SET NULL');
    t.text('payload_sha256').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id', 'status', 'flagged_at']);
    t.index(['block_id', 'row_number', 'position']);
    t.index(['task_id']);
    t.index(['position_id']);
  });
  await knex.raw(`alter table flags add constraint flags_reason_check check (reason in
    ('retrain', 'trunk-renewal', 'replant', 'lighter-bud-load', 'heavier-bud-load', 'remove-injured-wood', 'other'))`);
  await knex.raw(`alter table flags add constraint flags_status_check check (status in ('open', 'closed'))`);
  await knex.raw(`alter table flags add constraint flags_run_check check (to_position >= position)`);

  await knex.schema.createTable('task_items', (t) => {
    t.uuid('task_id').notNullable().references('tasks.id').onDelete('CASCADE');
    t.uuid('position_id').notNullable().references('vine_positions.id').onDelete('CASCADE');
    t.integer('row_number').notNullable();
    t.integer('position').notNullable();
    t.integer('sequence').notNullable();
    t.text('status').notNullable().defaultTo('open');
    t.timestamp('done_at', { useTz: true });
    t.uuid('done_by').references('users.id').onDelete('SET NULL');
    t.text('note').notNullable().defaultTo('');
    // The note observation that carries the photos of the work, when there are any. No foreign key:
    // the phone may send the update before that observation arrives.
    t.uuid('observation_id');
    t.primary(['task_id', 'position_id']);
    t.index(['position_id']);
  });
  await knex.raw(`alter table task_items add constraint task_items_status_check check (status in ('open', 'done'))`);

  await knex.schema.createTable('task_updates', (t) => {
    t.uuid('id').primary();
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.uuid('task_id').notNullable().references('tasks.id').onDelete('CASCADE');
    t.uuid('position_id').notNullable().references('vine_positions.id').onDelete('CASCADE');
    t.text('note').notNullable().defaultTo('');
    t.uuid('observation_id');
    t.timestamp('done_at', { useTz: true }).notNullable();
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL');
    t.text('payload_sha256').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['task_id']);
  });

  await knex.schema.createTable('comments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.text('subject_kind').notNullable();
    t.uuid('subject_id').notNullable();
    // The vine the subject sits on (an observation's or the vine itself), so a vine shows its threads.
    t.uuid('position_id').references('vine_positions.id').onDelete('CASCADE');
    t.text('body').notNullable();
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id', 'subject_kind', 'subject_id', 'created_at']);
    t.index(['position_id']);
  });
  await knex.raw(`alter table comments add constraint comments_subject_check check (subject_kind in ('observation', 'vine', 'task'))`);
  await knex.raw(`alter table comments add constraint comments_body_check check (char_length(body) between 1 and 4000)`);

  await knex.schema.createTable('comment_mentions', (t) => {
    t.uuid('comment_id').notNullable().references('comments.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.primary(['comment_id', 'user_id']);
    t.index(['user_id']);
  });
}

export async function down(knex: Knex) {
  for (const table of ['comment_mentions', 'comments', 'task_updates', 'task_items', 'flags', 'tasks']) {
    await knex.schema.dropTableIfExists(table);
  }
}
