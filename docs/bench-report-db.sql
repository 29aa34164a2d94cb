-- Builds a synthetic results database of 1,000,000 runs x 5 readings from a demo template (attached as t).
PRAGMA page_size = 4096;
PRAGMA journal_mode = OFF;
PRAGMA synchronous = OFF;
PRAGMA cache_size = -262144;
PRAGMA user_version = 1;
PRAGMA application_id = 1280594481;
ATTACH '/tmp/rb/tpl/results.db' AS t;
CREATE TABLE runs (
    seq INTEGER PRIMARY KEY AUTOINCREMENT, id TEXT NOT NULL UNIQUE, serial TEXT NOT NULL,
    verdict TEXT NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')), started_utc TEXT NOT NULL, ended_utc TEXT NOT NULL,
    product TEXT NOT NULL, sequence_id TEXT NOT NULL, sequence_revision INTEGER NOT NULL, sequence_sha256 TEXT NOT NULL,
    station TEXT NOT NULL, fixture TEXT NOT NULL, slot INTEGER NOT NULL, lot TEXT, operator TEXT, batch_id TEXT,
    mode TEXT NOT NULL, reason TEXT, first_failing_reading TEXT, reading_count INTEGER NOT NULL,
    prev_sha256 TEXT NOT NULL, record_sha256 TEXT NOT NULL, run_json TEXT NOT NULL);
CREATE TABLE readings (
    run_seq INTEGER NOT NULL REFERENCES runs (seq), ordinal INTEGER NOT NULL, run_id TEXT NOT NULL REFERENCES runs (id),
    name TEXT NOT NULL, value REAL, unit TEXT NOT NULL, low REAL, high REAL,
    verdict TEXT NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')), step TEXT, setpoint TEXT, uncertainty REAL,
    standard_uncertainty REAL, coverage_factor REAL, decision_rule TEXT, acceptance_low REAL, acceptance_high REAL,
    samples INTEGER, note TEXT, at_utc TEXT, PRIMARY KEY (run_seq, ordinal)) WITHOUT ROWID;
-- Template runs with all 13 readings, numbered 0..k-1; the 5 readings kept per run, renumbered 0..4.
CREATE TEMP TABLE tr AS SELECT row_number() OVER (ORDER BY seq) - 1 AS k, * FROM t.runs WHERE reading_count = 13;
CREATE TEMP TABLE tg AS SELECT g.run_seq, CASE g.name WHEN 'supply.current' THEN 0 WHEN 'cal-low.output' THEN 1
    WHEN 'cal-high.output' THEN 2 WHEN 'trim.gainCode' THEN 3 ELSE 4 END AS ord, g.*
    FROM t.readings g WHERE g.name IN ('supply.current', 'cal-low.output', 'cal-high.output', 'trim.gainCode', 'verify.error');
CREATE TEMP TABLE short_json AS SELECT run_json FROM t.runs ORDER BY length(run_json) LIMIT 1;
BEGIN;
WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 1000000)
INSERT INTO runs (seq, id, serial, verdict, started_utc, ended_utc, product, sequence_id, sequence_revision, sequence_sha256,
    station, fixture, slot, lot, operator, batch_id, mode, reason, first_failing_reading, reading_count, prev_sha256, record_sha256, run_json)
SELECT n.i, printf('%08x-0000-7000-8000-%012x', n.i, n.i), printf('CTP40A-%04d-%06d', 2600 + n.i / 1000000, n.i % 1000000),
    tr.verdict, strftime('%Y-%m-%dT%H:%M:%S.0000000Z', 1767225600 + n.i * 30 - 1500, 'unixepoch'),
    strftime('%Y-%m-%dT%H:%M:%S.0000000Z', 1767225600 + n.i * 30, 'unixepoch'),
    tr.product, tr.sequence_id, tr.sequence_revision, tr.sequence_sha256, 'ST-0' || (1 + n.i % 3), tr.fixture, tr.slot,
    'L-' || printf('%05d', n.i / 5000), tr.operator, 'B' || (n.i / 4), tr.mode, tr.reason, tr.first_failing_reading, 5,
    printf('%064x', n.i - 1), printf('%064x', n.i), (SELECT run_json FROM short_json)
FROM n JOIN tr ON tr.k = n.i % (SELECT count(*) FROM tr);
WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 1000000)
INSERT INTO readings
SELECT n.i, tg.ord, printf('%08x-0000-7000-8000-%012x', n.i, n.i), tg.name,
    tg.value * (1 + ((n.i * 7919) % 1000 - 500) * 1e-6), tg.unit, tg.low, tg.high, tg.verdict, tg.step, tg.setpoint,
    tg.uncertainty, tg.standard_uncertainty, tg.coverage_factor, tg.decision_rule, tg.acceptance_low, tg.acceptance_high,
    tg.samples, tg.note, strftime('%Y-%m-%dT%H:%M:%S.0000000Z', 1767225600 + n.i * 30 - 60, 'unixepoch')
FROM n JOIN tr ON tr.k = n.i % (SELECT count(*) FROM tr) JOIN tg ON tg.run_seq = tr.seq
ORDER BY n.i, tg.ord;
COMMIT;
CREATE INDEX ix_runs_serial ON runs (serial);
CREATE INDEX ix_runs_ended_utc ON runs (ended_utc);
CREATE INDEX ix_runs_summary ON runs (
    seq, id, serial, verdict, ended_utc, station, slot, lot, sequence_id, sequence_revision,
    reason, first_failing_reading);
CREATE INDEX ix_readings_run_id ON readings (run_id);
CREATE INDEX ix_readings_name ON readings (name);
DETACH t;
PRAGMA journal_mode = WAL;
