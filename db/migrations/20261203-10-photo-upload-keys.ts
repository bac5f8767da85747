import type { Knex } from 'knex';

// Devices upload to upload_key, never to the served object_key; confirm writes the served copy
// itself. upload_type and upload_bytes are what the device declared, bound into the upload link.
// A confirm claims the row for a short lease (confirm_claim, confirm_until) instead of holding a
// row lock while it reads object storage and decodes the image.
// Existing stored photos keep their object_key and are served as before. A pending row from before
// this migration was uploaded to its object_key; that key is kept as its upload key so that the
// device's confirm still finds the bytes.
export async function up(knex: Knex) {
  await knex.schema.alterTable('photos', (t) => {
    t.text('upload_key');
    t.text('upload_type');
    t.bigInteger('upload_bytes');
    t.uuid('confirm_claim');
    t.timestamp('confirm_until', { useTz: true });
  });
  await knex.raw(`update photos set upload_key = object_key where status = 'pending'`);
}

export async function down(knex: Knex) {
  await knex.schema.alterTable('photos', (t) => {
    t.dropColumn('upload_key');
    t.dropColumn('upload_type');
    t.dropColumn('upload_bytes');
    t.dropColumn('confirm_claim');
    t.dropColumn('confirm_until');
  });
}
