import type { Knex } from 'knex';

/** Accounts, rooms and roles, the room document's durable store, and the team features' tables. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.string('id', 40).primary();
    t.string('email', 320).notNullable().unique();
    t.string('display_name', 120).notNullable();
    t.string('password_hash', 200).notNullable();
    t.boolean('notify_reviews').notNullable().defaultTo(true);
    t.bigInteger('created_at').notNullable();
  });

  await knex.schema.createTable('rooms', (t) => {
    t.string('id', 40).primary();
    t.string('name', 200).notNullable();
    t.string('created_by', 40).references('users.id').onDelete('SET NULL');
    t.string('parent_snapshot_id', 40).nullable();
    t.bigInteger('created_at').notNullable();
    t.bigInteger('updated_at').notNullable();
  });

  await knex.schema.createTable('room_members', (t) => {
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
    t.string('role', 16).notNullable();
    t.bigInteger('created_at').notNullable();
    t.primary(['room_id', 'user_id']);
    t.index(['user_id']);
  });

  // The room document: an append-only log of accepted Yjs updates, compacted from time to time into
  // room_states (the merged state up to and including update `upto_id`). Load = state + later updates.
  await knex.schema.createTable('room_updates', (t) => {
    t.increments('id').primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.binary('update').notNullable();
    t.string('user_id', 40).nullable();
    t.bigInteger('created_at').notNullable();
    t.index(['room_id', 'id']);
  });
  await knex.schema.createTable('room_states', (t) => {
    t.string('room_id', 40).primary().references('rooms.id').onDelete('CASCADE');
    t.binary('state').notNullable();
    t.integer('upto_id').notNullable().defaultTo(0);
    t.bigInteger('updated_at').notNullable();
  });

  await knex.schema.createTable('room_log', (t) => {
    t.increments('id').primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('user_id', 40).nullable();
    t.string('message', 1000).notNullable();
    t.bigInteger('created_at').notNullable();
    t.index(['room_id', 'id']);
  });

  await knex.schema.createTable('snapshots', (t) => {
    t.string('id', 40).primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('label', 200).notNullable();
    t.text('design_json').notNullable();
    t.binary('state').notNullable();
    t.text('figures_json').nullable();
    t.boolean('for_review').notNullable().defaultTo(false);
    t.string('created_by', 40).nullable();
    t.bigInteger('created_at').notNullable();
    t.index(['room_id', 'created_at']);
  });

  await knex.schema.createTable('notes', (t) => {
    t.string('id', 40).primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('author_id', 40).nullable();
    t.string('parent_id', 40).nullable();
    t.string('element_id', 100).nullable();
    t.double('frequency_hz').nullable();
    t.text('body').notNullable();
    t.boolean('resolved').notNullable().defaultTo(false);
    t.bigInteger('created_at').notNullable();
    t.index(['room_id', 'created_at']);
  });

  await knex.schema.createTable('uploads', (t) => {
    t.string('id', 40).primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('uploader_id', 40).nullable();
    t.string('file_name', 255).notNullable();
    t.integer('ports').notNullable();
    t.integer('points').notNullable();
    t.double('start_hz').notNullable();
    t.double('stop_hz').notNullable();
    t.text('text').notNullable();
    t.bigInteger('created_at').notNullable();
    t.index(['room_id', 'created_at']);
  });

  await knex.schema.createTable('invitations', (t) => {
    t.string('id', 40).primary();
    t.string('room_id', 40).notNullable().references('rooms.id').onDelete('CASCADE');
    t.string('email', 320).notNullable();
    t.string('role', 16).notNullable();
    t.string('invited_by', 40).nullable();
    t.bigInteger('expires_at').notNullable();
    t.bigInteger('used_at').nullable();
    t.bigInteger('created_at').notNullable();
    t.index(['email']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['invitations', 'uploads', 'notes', 'snapshots', 'room_log', 'room_states', 'room_updates', 'room_members', 'rooms', 'users'])
    await knex.schema.dropTableIfExists(table);
}
