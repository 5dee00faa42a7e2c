import type { Knex } from 'knex';

/**
 * Team features of issue 7: invitation links (a random token, stored only as its SHA-256 hash),
 * note editing and resolving, and who marked a snapshot for review.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('invitations', (t) => {
    t.string('token_hash', 64).nullable();
    t.string('user_id', 40).nullable();
  });
  await knex.schema.alterTable('invitations', (t) => {
    t.unique(['token_hash']);
    t.index(['room_id']);
  });

  await knex.schema.alterTable('notes', (t) => {
    t.bigInteger('updated_at').nullable();
    t.string('resolved_by', 40).nullable();
    t.bigInteger('resolved_at').nullable();
  });
  await knex.schema.alterTable('notes', (t) => {
    t.index(['room_id', 'parent_id']);
  });

  await knex.schema.alterTable('rooms', (t) => {
    t.index(['parent_snapshot_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('rooms', (t) => {
    t.dropIndex(['parent_snapshot_id']);
  });
  await knex.schema.alterTable('notes', (t) => {
    t.dropIndex(['room_id', 'parent_id']);
    t.dropColumn('updated_at');
    t.dropColumn('resolved_by');
    t.dropColumn('resolved_at');
  });
  await knex.schema.alterTable('invitations', (t) => {
    t.dropUnique(['token_hash']);
    t.dropIndex(['room_id']);
    t.dropColumn('token_hash');
    t.dropColumn('user_id');
  });
}
