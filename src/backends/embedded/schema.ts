/**
 * The embedded backend's SQLite layout. `PRAGMA user_version` records which migrations
 * have run; each migration runs once, inside a transaction, in order.
 */
import type Database from 'better-sqlite3'

const MIGRATIONS: readonly string[] = [
  `
  CREATE TABLE sweeps (
    -- Insertion order: breaks createdAt ties for FIFO dispatch and list cursors.
    seq           INTEGER PRIMARY KEY AUTOINCREMENT,
    id            TEXT NOT NULL UNIQUE,
    owner         TEXT,
    label         TEXT,
    spec_hash     TEXT NOT NULL,
    spec_json     TEXT NOT NULL,
    status        TEXT NOT NULL CHECK (status IN ('queued', 'running', 'succeeded', 'failed', 'canceled')),
    created_ms    INTEGER NOT NULL,
    started_ms    INTEGER,
    finished_ms   INTEGER,
    points_total  INTEGER NOT NULL,
    trials_total  INTEGER NOT NULL,
    chunks_total  INTEGER NOT NULL,
    points_done   INTEGER NOT NULL DEFAULT 0,
    trials_done   INTEGER NOT NULL DEFAULT 0,
    chunks_done   INTEGER NOT NULL DEFAULT 0,
    error_kind    TEXT CHECK (error_kind IN ('user', 'system')),
    error_message TEXT,
    reused_from   TEXT REFERENCES sweeps (id)
  );
  CREATE INDEX sweeps_by_owner ON sweeps (owner, created_ms, seq);
  CREATE INDEX sweeps_by_owner_status ON sweeps (owner, status, created_ms, seq);
  CREATE INDEX sweeps_reusable ON sweeps (owner, spec_hash, created_ms) WHERE status = 'succeeded';

  -- One row per finished chunk of an active sweep; a retried chunk replaces its row (primary
  -- key), never adds. Rows are dropped once the sweep ends: the result holds every trial.
  CREATE TABLE chunk_results (
    sweep_id    TEXT NOT NULL REFERENCES sweeps (id),
    chunk_index INTEGER NOT NULL,
    point       INTEGER NOT NULL,
    trials      INTEGER NOT NULL,
    compute_ms  REAL NOT NULL,
    codec       TEXT NOT NULL,
    body        BLOB NOT NULL,
    finished_ms INTEGER NOT NULL,
    PRIMARY KEY (sweep_id, chunk_index)
  ) WITHOUT ROWID;

  -- The assembled result, written once when the sweep succeeds.
  CREATE TABLE sweep_results (
    sweep_id   TEXT PRIMARY KEY REFERENCES sweeps (id),
    codec      TEXT NOT NULL,
    body       BLOB NOT NULL,
    created_ms INTEGER NOT NULL
  );

  -- Idempotency-Key bindings, per owner ('' when tokens are off).
  CREATE TABLE idempotency_keys (
    owner_key  TEXT NOT NULL,
    key        TEXT NOT NULL,
    spec_hash  TEXT NOT NULL,
    sweep_id   TEXT NOT NULL REFERENCES sweeps (id),
    created_ms INTEGER NOT NULL,
    PRIMARY KEY (owner_key, key)
  ) WITHOUT ROWID;
  `,
  // Version 2: the plan is stored with the sweep (resume and repair read it back, never
  // re-plan), chunk results are kept after a sweep ends (the stored result holds rows, the
  // chunks hold the trial records), and the active cap counts through an index.
  `
  ALTER TABLE sweeps ADD COLUMN plan_json TEXT;
  CREATE INDEX sweeps_active_by_owner ON sweeps (owner) WHERE status IN ('queued', 'running');
  `,
  // Version 3: the research workflow. A sweep's description (tags, notes), what it extends and
  // took from earlier sweeps, its replicate key, the points whose trial blocks are still being
  // decided (precision targets), and an index from each point's reuse key (engine, seed, the
  // point's parameters) to the sweeps that hold its trials.
  `
  ALTER TABLE sweeps ADD COLUMN extends TEXT;
  ALTER TABLE sweeps ADD COLUMN tags_json TEXT NOT NULL DEFAULT '[]';
  ALTER TABLE sweeps ADD COLUMN notes TEXT;
  ALTER TABLE sweeps ADD COLUMN replicate_key TEXT NOT NULL DEFAULT '';
  ALTER TABLE sweeps ADD COLUMN reused_points INTEGER NOT NULL DEFAULT 0;
  ALTER TABLE sweeps ADD COLUMN reused_trials INTEGER NOT NULL DEFAULT 0;
  ALTER TABLE sweeps ADD COLUMN open_points_json TEXT NOT NULL DEFAULT '[]';
  ALTER TABLE chunk_results ADD COLUMN first_trial INTEGER;
  CREATE INDEX sweeps_by_replicate ON sweeps (replicate_key, created_ms, seq);

  CREATE TABLE point_keys (
    sweep_id  TEXT NOT NULL REFERENCES sweeps (id),
    point     INTEGER NOT NULL,
    owner     TEXT,
    reuse_key TEXT NOT NULL,
    PRIMARY KEY (sweep_id, point)
  ) WITHOUT ROWID;
  CREATE INDEX point_keys_by_key ON point_keys (reuse_key, owner);
  `,
  // Version 4: the outbox of completion callbacks (src/sweep/callbacks.ts), one row per sweep
  // that asked for one. A terminal move arms it in its own transaction; due_ms is also the
  // lease of a claimed delivery.
  `
  CREATE TABLE sweep_callbacks (
    sweep_id     TEXT PRIMARY KEY REFERENCES sweeps (id),
    url          TEXT NOT NULL,
    state        TEXT NOT NULL DEFAULT 'waiting',
    attempts     INTEGER NOT NULL DEFAULT 0,
    last_error   TEXT,
    generation   INTEGER NOT NULL DEFAULT 0,
    event_status TEXT,
    finished_ms  INTEGER,
    due_ms       INTEGER
  ) WITHOUT ROWID;
  CREATE INDEX sweep_callbacks_due ON sweep_callbacks (due_ms) WHERE state = 'pending';
  `,
  // Version 5: whether a sweep takes stored trials of earlier sweeps, kept for the later blocks
  // of its precision targets (decided while it runs). Sweeps stored before: yes, the default.
  `
  ALTER TABLE sweeps ADD COLUMN reuse_points INTEGER NOT NULL DEFAULT 1;
  `
]

/** Brings the database to the latest layout; refuses one written by a newer memsweep. */
export function migrate (db: Database.Database): void {
  const current = Number(db.pragma('user_version', { simple: true }))
  if (current > MIGRATIONS.length) {
    throw new Error(`The data directory was written by a newer memsweep (schema ${current}, this build knows ${MIGRATIONS.length}).`)
  }
  for (let version = current; version < MIGRATIONS.length; version++) {
    db.transaction(() => {
      db.exec(MIGRATIONS[version] as string)
      db.pragma(`user_version = ${version + 1}`, { simple: true })
    })()
  }
}
