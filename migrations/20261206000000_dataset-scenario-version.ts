import type { Knex } from 'knex';

// A dataset is made for one scenario version: its header is checked against that version's
// level ids, and its values are in that version's units. `scenario_version` records which;
// `levels` the ids and units of its level columns as that version defined them (JSON text), so
// a calibration of another version can tell whether the data still fit.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('dataset_versions', (t) => {
    t.integer('scenario_version');
    t.text('levels');
  });
  // Earlier uploads were checked against the scenario's latest version at the time: the newest
  // version saved at or before the upload.
  await knex('dataset_versions').update({
    scenario_version: knex('scenario_versions')
      .max('version')
      .where('scenario_versions.scenario_id', knex.ref('dataset_versions.scenario_id'))
      .andWhere('scenario_versions.created_at', '<=', knex.ref('dataset_versions.created_at')),
  });
  await knex('dataset_versions').whereNull('scenario_version').update({ scenario_version: 1 });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('dataset_versions', (t) => {
    t.dropColumn('levels');
    t.dropColumn('scenario_version');
  });
}
