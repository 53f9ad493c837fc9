// Every migration, by name. Listed statically so the same code runs under tsx, Vitest and a
// compiled build; a test checks that every migration file in this folder is listed.
import type { Migration } from 'kysely';
import * as m20261201000000 from './2026_12_01_000000_accounts_and_banks';
import * as m20261201000100 from './2026_12_01_000100_invitations_and_resets';
import * as m20261201000200 from './2026_12_01_000200_species_lots_stock_photos';
import * as m20261201000300 from './2026_12_01_000300_germination_tests';
import * as m20261201000400 from './2026_12_01_000400_bank_decision_settings';
import * as m20261201000500 from './2026_12_01_000500_sowing_plan';
import * as m20261201000600 from './2026_12_01_000600_reminders';
import * as m20261201000700 from './2026_12_01_000700_treated_seed';
import * as m20261202000000 from './2026_12_02_000000_stored_test_results';
import * as m20261202000100 from './2026_12_02_000100_test_set_aside';
import * as m20261202000200 from './2026_12_02_000200_stored_lot_figures';
import * as m20261202000300 from './2026_12_02_000300_change_notices';
import * as m20261202003517 from './2026_12_02_003517_sowing_emergence';
import * as m20261202004162 from './2026_12_02_004162_lot_seed_weights';
import * as m20261202004817 from './2026_12_02_004817_mail_queue';
import * as m20261202005317 from './2026_12_02_005317_sprinkled_trays';
import * as m20261202005538 from './2026_12_02_005538_calendar_feeds';
import * as m20261202006271 from './2026_12_02_006271_rate_limits';
import * as m20261202007315 from './2026_12_02_007315_lot_amount_kind';
import * as m20261203004317 from './2026_12_03_004317_plan_follows_inputs';
import * as m20261203004731 from './2026_12_03_004731_reminders_that_fit';
import * as m20261203004731spaces from './2026_12_03_004731_growing_spaces';
import * as m20261203004726 from './2026_12_03_004726_idempotency_keys';
// Generations
import * as m20261203006183 from './2026_12_03_006183_plants_grown_from_lot';
// Offers between banks.
import * as m20261203006142 from './2026_12_03_006142_lot_offers';
// Packet pages
import * as m20261203006483 from './2026_12_03_006483_packet_pages';
// Keeping varieties true.
import * as m20261203006142true from './2026_12_03_006142_keeping_varieties_true';

export const migrations: Record<string, Migration> = {
  '2026_12_01_000000_accounts_and_banks': m20261201000000,
  '2026_12_01_000100_invitations_and_resets': m20261201000100,
  '2026_12_01_000200_species_lots_stock_photos': m20261201000200,
  '2026_12_01_000300_germination_tests': m20261201000300,
  '2026_12_01_000400_bank_decision_settings': m20261201000400,
  '2026_12_01_000500_sowing_plan': m20261201000500,
  '2026_12_01_000600_reminders': m20261201000600,
  '2026_12_01_000700_treated_seed': m20261201000700,
  '2026_12_02_000000_stored_test_results': m20261202000000,
  '2026_12_02_000100_test_set_aside': m20261202000100,
  '2026_12_02_000200_stored_lot_figures': m20261202000200,
  '2026_12_02_000300_change_notices': m20261202000300,
  '2026_12_02_003517_sowing_emergence': m20261202003517,
  '2026_12_02_004162_lot_seed_weights': m20261202004162,
  '2026_12_02_004817_mail_queue': m20261202004817,
  '2026_12_02_005317_sprinkled_trays': m20261202005317,
  '2026_12_02_005538_calendar_feeds': m20261202005538,
  '2026_12_02_006271_rate_limits': m20261202006271,
  '2026_12_02_007315_lot_amount_kind': m20261202007315,
  '2026_12_03_004317_plan_follows_inputs': m20261203004317,
  '2026_12_03_004731_growing_spaces': m20261203004731spaces,
  '2026_12_03_004731_reminders_that_fit': m20261203004731,
  '2026_12_03_004726_idempotency_keys': m20261203004726,
  // Generations
  '2026_12_03_006183_plants_grown_from_lot': m20261203006183,
  // Offers between banks.
  '2026_12_03_006142_lot_offers': m20261203006142,
  // Packet pages
  '2026_12_03_006483_packet_pages': m20261203006483,
  // Keeping varieties true.
  '2026_12_03_006142_keeping_varieties_true': m20261203006142true,
};
