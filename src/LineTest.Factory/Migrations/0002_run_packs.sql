-- LineTest factory database, version 2: runs packed per station database and month, for reports.
-- Applied once by FactoryMigrations, inside one transaction, and recorded in schema_migrations.
--
-- A report over a million runs cannot afford a row per reading on the wire. run_packs holds, per station database
-- (chain) and UTC month, what a report reads of those runs and their readings in one compact value (RunPack's
-- format, versioned by "format"). Packs are derived data: written by the report (RunPackBuilder) from runs and
-- readings, never by the forwarder, and rebuilt from them at any time (DELETE FROM run_packs; DELETE FROM
-- run_pack_marks). runs and readings stay the record.

-- Per chain: every run of the chain with station_seq <= packed_seq is in the chain's packs. Runs arrive in seq order
-- (the forwarder refuses a run that does not continue its chain), so a pack is extended only by runs above the mark.
CREATE TABLE run_pack_marks (
    chain_id    uuid        PRIMARY KEY,
    packed_seq  bigint      NOT NULL,
    built_utc   timestamptz NOT NULL DEFAULT now()
);

CREATE TABLE run_packs (
    month       timestamptz NOT NULL,  -- the first instant of the UTC month of the runs' end
    chain_id    uuid        NOT NULL,
    runs        integer     NOT NULL,
    readings    bigint      NOT NULL,
    last_seq    bigint      NOT NULL,
    format      integer     NOT NULL,
    body        bytea       NOT NULL,
    built_utc   timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (month, chain_id)
);

-- Stored as it is, out of line: a pack is mostly doubles and integers, which compression gains little on and costs
-- every report the time to decompress.
ALTER TABLE run_packs ALTER COLUMN body SET STORAGE EXTERNAL;
