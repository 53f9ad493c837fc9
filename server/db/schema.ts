import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export type Role = 'owner' | 'grower' | 'viewer';

export interface UserTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string;
  /** When the account proved its e-mail address by a link; null until then. */
  email_verified_at: ColumnType<Date | null, Date | null | undefined, Date | null>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface SessionTable {
  id: Generated<string>;
  user_id: string;
  created_at: Timestamp;
  expires_at: Date;
  last_seen_at: Timestamp;
  user_agent: string | null;
}

export interface BankTable {
  id: Generated<string>;
  name: string;
  last_frost: string | null;
  first_frost: string | null;
  frost_margin_days: ColumnType<number, number | undefined, number>;
  time_zone: ColumnType<string, string | undefined, string>;
  sow_threshold_percent: ColumnType<number, number | undefined, number>;
  establishment_factor: ColumnType<string, number | string | undefined, number | string>;
  sowing_assurance: ColumnType<string, number | string | undefined, number | string>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface MembershipTable {
  bank_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
  remind_sowing: ColumnType<boolean | null, boolean | null | undefined, boolean | null>;
  remind_checks: ColumnType<boolean | null, boolean | null | undefined, boolean | null>;
  remind_retest: ColumnType<boolean | null, boolean | null | undefined, boolean | null>;
  remind_digest: ColumnType<boolean | null, boolean | null | undefined, boolean | null>;
  /** The local hour (0–23, in the bank's time zone) this member's reminders go out from. */
  remind_hour: ColumnType<number, number | undefined, number>;
}

export type ReminderKind = 'sowing' | 'check' | 'retest' | 'digest';

export interface ReminderTable {
  id: Generated<string>;
  dedupe_key: string;
  bank_id: string;
  user_id: string;
  kind: ReminderKind;
  due_on: string;
  subject: string;
  body: string;
  attempts: ColumnType<number, number | undefined, number>;
  sending_since: Date | null;
  sent_at: Date | null;
  created_at: Timestamp;
  /** The germination test a check-day reminder is about. */
  test_id: ColumnType<string | null, string | null | undefined, string | null>;
  /** Set instead of `sent_at` when the send found the reminder no longer needed. */
  skipped_at: ColumnType<Date | null, Date | null | undefined, Date | null>;
  skip_reason: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface AppMetaTable {
  key: string;
  value: unknown;
  updated_at: Timestamp;
}

export interface InvitationTable {
  id: Generated<string>;
  bank_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  created_at: Timestamp;
  expires_at: Date;
  accepted_at: Date | null;
  accepted_by: string | null;
  revoked_at: Date | null;
  /** The invitation's latest mail in the queue. */
  mail_id: ColumnType<string | null, string | null | undefined, string | null>;
}

export type MailKind = 'invitation' | 'password_reset' | 'email_verification' | 'offer_request';
export type MailStatus = 'waiting' | 'sending' | 'sent' | 'skipped' | 'expired';

export interface MailQueueTable {
  id: Generated<string>;
  kind: MailKind;
  to_address: string;
  subject: string | null;
  body: string | null;
  status: ColumnType<MailStatus, MailStatus | undefined, MailStatus>;
  attempts: ColumnType<number, number | undefined, number>;
  next_attempt_at: Timestamp;
  claimed_at: Date | null;
  sent_at: Date | null;
  last_error: string | null;
  expires_at: Date | null;
  created_at: Timestamp;
}

export interface EmailVerificationTable {
  id: Generated<string>;
  user_id: string;
  email: string;
  token_hash: string;
  created_at: Timestamp;
  expires_at: Date;
  used_at: Date | null;
}

export interface PasswordResetTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  created_at: Timestamp;
  expires_at: Date;
  used_at: Date | null;
}

/** numeric columns arrive from pg as strings; repositories parse them. */
type Numeric = ColumnType<string, number | string, number | string>;

export interface SpeciesTable {
  id: Generated<string>;
  bank_id: string | null;
  ref_key: string | null;
  common_name: string;
  scientific_name: string;
  family: string | null;
  traits: ColumnType<unknown, string, string>;
  sources: ColumnType<unknown, string | undefined, string>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface SpeciesOverrideTable {
  bank_id: string;
  species_id: string;
  traits: ColumnType<unknown, string, string>;
  updated_at: Timestamp;
}

export type PhotoSubject = 'lot' | 'plant' | 'tray';

export interface PhotoTable {
  id: string;
  bank_id: string;
  subject: PhotoSubject;
  subject_id: string;
  full_key: string;
  thumb_key: string;
  width: number;
  height: number;
  bytes: number;
  created_by: string | null;
  created_at: Timestamp;
}

export interface ObjectDeletionTable {
  key: string;
  created_at: Timestamp;
}

export interface ParentPlantTable {
  id: Generated<string>;
  bank_id: string;
  species_id: string;
  label: string;
  variety: string | null;
  location: string | null;
  season: number | null;
  hybrid: ColumnType<boolean, boolean | undefined, boolean>;
  notes: string | null;
  /** The bank's lot this plant grew from (generations); null: not grown from a lot of this bank. */
  grown_from_lot_id: ColumnType<string | null, string | null | undefined, string | null>;
  created_at: Timestamp;
  updated_at: Timestamp;
  // Keeping a variety true: how the plant was kept apart from other varieties (null: not said).
  isolation_method: IsolationMethod | null;
  isolation_meters: Numeric | null;
}

export type IsolationMethod = 'distance' | 'time' | 'bagging' | 'none';

export type LotOrigin = 'saved' | 'swapped' | 'bought';
export type LotStatus = 'active' | 'depleted' | 'retired';
export type AmountKind = 'counted' | 'estimated' | 'weighed' | 'unknown';
export type StoragePlace = 'room' | 'fridge' | 'freezer' | 'other';

export interface LotTable {
  id: Generated<string>;
  bank_id: string;
  species_id: string;
  code: string;
  variety: string;
  origin: LotOrigin;
  source_name: string | null;
  harvest_date: string | null;
  packed_for_season: number | null;
  plants_bulked: number | null;
  storage_place: StoragePlace | null;
  storage_location: string | null;
  storage_temp_c: Numeric | null;
  storage_humidity_pct: Numeric | null;
  quantity_estimated: ColumnType<boolean, boolean | undefined, boolean>;
  treated: ColumnType<boolean, boolean | undefined, boolean>;
  grams_entered: Numeric | null;
  amount_kind: ColumnType<AmountKind, AmountKind | undefined, AmountKind>;
  /** The seeds the weighed grams were last turned into (weighed amounts only). */
  weighed_seeds: number | null;
  status: ColumnType<LotStatus, LotStatus | undefined, LotStatus>;
  notes: string | null;
  created_by: string | null;
  created_at: Timestamp;
  updated_at: Timestamp;
  /** Kept by the database from the stock ledger, lot_parents and photos (never written by the app). */
  seeds_on_hand: ColumnType<number, never, never>;
  parent_plant_ids: ColumnType<string[], never, never>;
  first_photo_id: ColumnType<string | null, never, never>;
}

/** One weighed sample of a lot: seeds counted, their weight, and their weight once cleaned. */
export interface LotSeedWeightTable {
  id: Generated<string>;
  bank_id: string;
  lot_id: string;
  seeds: number;
  grams: Numeric;
  /** The sample's weight after the chaff and other matter are picked out (null: not cleaned). */
  clean_grams: Numeric | null;
  created_by: string | null;
  created_at: Timestamp;
}

/** Moves whenever an input of a bank's viability fits of one species changes (set by triggers). */
export interface ViabilityStampTable {
  bank_id: string;
  species_id: string;
  stamp: ColumnType<number, never, never>;
}

export interface LotParentTable {
  lot_id: string;
  parent_plant_id: string;
}

export type MovementKind = 'initial' | 'sown' | 'given' | 'swapped-in' | 'test' | 'correction';

export interface StockMovementTable {
  id: Generated<string>;
  lot_id: string;
  kind: MovementKind;
  change: number;
  date: string;
  reason: string;
  test_id: ColumnType<string | null, string | null | undefined, string | null>;
  created_by: string | null;
  created_at: Timestamp;
}

export type Pretreatment = 'none' | 'soak' | 'cold-stratification' | 'scarification';

export interface GerminationTestTable {
  id: Generated<string>;
  bank_id: string;
  lot_id: string;
  start_date: string;
  method: string;
  medium: string | null;
  temperature_c: Numeric | null;
  light_hours: Numeric | null;
  pretreatment: ColumnType<Pretreatment, Pretreatment | undefined, Pretreatment>;
  pretreatment_days: number | null;
  notes: string | null;
  status: ColumnType<'running' | 'finished', 'running' | 'finished' | undefined, 'running' | 'finished'>;
  finished_on: string | null;
  created_by: string | null;
  /** The member running the test, whom its check-day reminders go to; on insert, its starter. */
  run_by: ColumnType<string | null, string | null | undefined, string | null>;
  created_at: Timestamp;
  updated_at: Timestamp;
  /** The stored result (summarizeTest's AssaySummary as JSON), written with every change to the test. */
  result: ColumnType<unknown, string | null | undefined, string | null>;
  /** Which definition of the result computed it; older ones are recomputed at start. */
  result_version: ColumnType<number, number | undefined, number>;
  result_sown: ColumnType<number | null, number | null | undefined, number | null>;
  result_germinated: ColumnType<number | null, number | null | undefined, number | null>;
  result_percent: ColumnType<number | null, number | null | undefined, number | null>;
  result_mean_days: ColumnType<number | null, number | null | undefined, number | null>;
  result_last_count_date: ColumnType<string | null, string | null | undefined, string | null>;
  /** Why the grower set the whole test aside (mouldy towel, too cold); it then leaves the model. */
  set_aside_reason: ColumnType<string | null, string | null | undefined, string | null>;
}

type TraySownBy = 'count' | 'weight' | 'guess';
/** A nullable column that may be left out on insert. */
type Opt<T> = ColumnType<T | null, T | null | undefined, T | null>;

export interface TestTrayTable {
  id: Generated<string>;
  test_id: string;
  position: number;
  /** The counted seeds; null for a tray sown by weight or by a rough guess. */
  seeds_sown: number | null;
  /** How the tray was sown; a tray not counted keeps the estimate of its seeds made then (sown-estimate.ts). */
  sown_by: ColumnType<TraySownBy, TraySownBy | undefined, TraySownBy>;
  sown_grams: Opt<number>;
  sown_guess: Opt<'pinch' | 'few-dozen' | 'hundreds'>;
  sown_mean: Opt<number>;
  sown_sd: Opt<number>;
  sown_low: Opt<number>;
  sown_high: Opt<number>;
  sown_basis: Opt<'lot' | 'species'>;
  sown_purity_assumed: ColumnType<boolean, boolean | undefined, boolean>;
  abnormal: number | null;
  ungerminated: number | null;
  fresh: number | null;
  dead: number | null;
  hard: number | null;
  /** Why the grower set the tray aside (spilled, dried out); such a tray is left out of every figure. */
  set_aside_reason: ColumnType<string | null, string | null | undefined, string | null>;
}

/** A tray scored roughly on a check day, when its seedlings cannot be counted. */
export interface TrayScoreTable {
  tray_id: string;
  check_date: string;
  score: 'none' | 'few' | 'half' | 'most';
  created_by: string | null;
  created_at: Timestamp;
}

export interface TrayCountTable {
  tray_id: string;
  check_date: string;
  cumulative: number;
  created_by: string | null;
  created_at: Timestamp;
}

export interface PlanEntryTable {
  id: Generated<string>;
  bank_id: string;
  season: number;
  species_id: string;
  lot_id: string | null;
  lot_chosen: ColumnType<boolean, boolean | undefined, boolean>;
  plants_wanted: number;
  start: 'indoors' | 'direct';
  seeds_to_sow: number | null;
  sow_from: string;
  sow_to: string;
  expect_from: string | null;
  expect_by: string | null;
  harden_from: string | null;
  transplant_on: string | null;
  notes: ColumnType<unknown, string | undefined, string>;
  sown_on: string | null;
  sown_movement_id: string | null;
  /** Succession sowings: the succession, this sowing's number in it and the weeks between. */
  succession_id: string | null;
  succession_no: number | null;
  succession_weeks: number | null;
  /** Days after the succession's first sowing (0 for a single sowing). */
  offset_days: ColumnType<number, number | undefined, number>;
  /** A sowing for seed (a biennial's runs over two seasons: overwintering, then the seed year). */
  for_seed: ColumnType<boolean, boolean | undefined, boolean>;
  created_by: string | null;
  created_at: Timestamp;
  updated_at: Timestamp;
}

/** What a moved last-frost date did to a season's unsown plan entries. */
export interface PlanMoveTable {
  id: Generated<string>;
  bank_id: string;
  season: number;
  from_frost: string;
  to_frost: string;
  days: number;
  entries: number;
  created_at: Timestamp;
}

/** What came up from a sowing (a plan entry marked sown): counted or scored, on a day after it. */
export interface SowingEmergenceTable {
  id: Generated<string>;
  bank_id: string;
  plan_entry_id: string;
  lot_id: string;
  sown_movement_id: string;
  sown_on: string;
  seeds_sown: number;
  date: string;
  seedlings: number | null;
  score: 'none' | 'few' | 'half' | 'most' | null;
  created_by: string | null;
  created_at: Timestamp;
}

/** An attempt counter of a rate limit (server/http/rate-limit.ts); `key` is a SHA-256, hex. */
export interface RateLimitTable {
  key: string;
  hits: number;
  reset_at: Date;
}

/** A member's private calendar feed of a bank (server/modules/calendar); `token_hash` is a SHA-256, hex. */
export interface CalendarFeedTable {
  bank_id: string;
  user_id: string;
  nonce: string;
  token_hash: string;
  created_at: Timestamp;
}

export interface GrowingSpaceTable {
  id: Generated<string>;
  bank_id: string;
  name: string;
  capacity: number;
  unit: 'cells' | 'trays';
  created_at: Timestamp;
  updated_at: Timestamp;
}

/**
 * A write sent with an Idempotency-Key (server/http/idempotency.ts): claimed while it runs (`status`
 * null), then its first answer, which a repeat of the same key gets instead of running again.
 * `request_hash` is a SHA-256, hex, of the method, path and body; `body` is the answer's JSON.
 */
export interface IdempotencyKeyTable {
  user_id: string;
  key: string;
  request_hash: string;
  status: number | null;
  /** Read back parsed; written as JSON text. */
  body: ColumnType<unknown, string | null, string | null>;
  created_at: Date;
}

// Offers between banks (server/modules/offers).
export type OfferStatus = 'open' | 'accepted' | 'declined' | 'withdrawn';

/** Part of a lot offered to another bank (`to_bank_id`) or by a link (`token_hash`, a SHA-256, hex). */
export interface LotOfferTable {
  id: Generated<string>;
  from_bank_id: string;
  lot_id: string;
  seeds: number;
  to_bank_id: string | null;
  token_hash: string | null;
  expires_at: Date | null;
  show_bank_name: ColumnType<boolean, boolean | undefined, boolean>;
  status: ColumnType<OfferStatus, OfferStatus | undefined, OfferStatus>;
  created_by: string | null;
  created_at: Timestamp;
  decided_at: Opt<Date>;
  accepted_bank_id: Opt<string>;
  accepted_lot_id: Opt<string>;
  accepted_by: Opt<string>;
}

/** A member asking for an offered lot; the giver is mailed. */
export interface OfferRequestTable {
  id: Generated<string>;
  offer_id: string;
  user_id: string;
  note: string | null;
  mail_id: Opt<string>;
  created_at: Timestamp;
}

/** A finished test of the giver's lot, copied read-only onto the lot made when an offer was accepted. */
export interface ReceivedTestTable {
  id: Generated<string>;
  bank_id: string;
  lot_id: string;
  offer_id: string | null;
  start_date: string;
  finished_on: string | null;
  method: string;
  medium: string | null;
  temperature_c: Numeric | null;
  light_hours: Numeric | null;
  pretreatment: Pretreatment;
  trays: number;
  /** The giver's stored result (AssaySummary JSON) with the trays' ids and set-aside reasons removed. */
  result: ColumnType<unknown, string, string>;
  result_sown: number | null;
  result_germinated: number | null;
  result_percent: number | null;
  result_mean_days: number | null;
  result_last_count_date: string | null;
}

// Packet pages
/** A lot's public packet page: the token's hash to find it by, and the nonce its token is made from. */
export interface PacketPageTable {
  lot_id: string;
  bank_id: string;
  nonce: string;
  token_hash: string;
  created_at: ColumnType<Date, Date | undefined, Date>;
}

export interface Database {
  users: UserTable;
  sessions: SessionTable;
  banks: BankTable;
  memberships: MembershipTable;
  app_meta: AppMetaTable;
  invitations: InvitationTable;
  password_resets: PasswordResetTable;
  mail_queue: MailQueueTable;
  email_verifications: EmailVerificationTable;
  species: SpeciesTable;
  species_overrides: SpeciesOverrideTable;
  photos: PhotoTable;
  object_deletions: ObjectDeletionTable;
  parent_plants: ParentPlantTable;
  lots: LotTable;
  lot_parents: LotParentTable;
  stock_movements: StockMovementTable;
  lot_seed_weights: LotSeedWeightTable;
  germination_tests: GerminationTestTable;
  test_trays: TestTrayTable;
  tray_counts: TrayCountTable;
  tray_scores: TrayScoreTable;
  plan_entries: PlanEntryTable;
  plan_moves: PlanMoveTable;
  sowing_emergence: SowingEmergenceTable;
  reminders: ReminderTable;
  viability_stamps: ViabilityStampTable;
  rate_limits: RateLimitTable;
  calendar_feeds: CalendarFeedTable;
  growing_spaces: GrowingSpaceTable;
  idempotency_keys: IdempotencyKeyTable;
  // Offers between banks.
  lot_offers: LotOfferTable;
  offer_requests: OfferRequestTable;
  received_tests: ReceivedTestTable;
  // Packet pages
  packet_pages: PacketPageTable;
}

export type User = Selectable<UserTable>;
export type NewUser = Insertable<UserTable>;
export type UserUpdate = Updateable<UserTable>;
export type Session = Selectable<SessionTable>;
export type Bank = Selectable<BankTable>;
export type NewBank = Insertable<BankTable>;
export type BankUpdate = Updateable<BankTable>;
export type Membership = Selectable<MembershipTable>;
export type Invitation = Selectable<InvitationTable>;
export type SpeciesRow = Selectable<SpeciesTable>;
export type Lot = Selectable<LotTable>;
export type ParentPlant = Selectable<ParentPlantTable>;
export type Photo = Selectable<PhotoTable>;
