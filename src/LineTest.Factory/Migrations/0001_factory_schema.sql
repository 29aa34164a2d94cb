-- LineTest factory database, version 1: the runs of every station, their hash chains, and alarms.
-- Applied once by FactoryMigrations, inside one transaction, and recorded in schema_migrations.

-- Which factory database this is: stations key their outbox by it, so a new database receives every run again.
CREATE TABLE factory_identity (
    id          uuid        PRIMARY KEY DEFAULT gen_random_uuid(),
    created_utc timestamptz NOT NULL DEFAULT now()
);
INSERT INTO factory_identity DEFAULT VALUES;

-- One row per station database (its hash chain): the head the server has committed.
CREATE TABLE chains (
    chain_id     uuid        PRIMARY KEY,
    station      text        COLLATE "C" NOT NULL,
    head_seq     bigint      NOT NULL,
    head_sha256  text        NOT NULL,
    runs         bigint      NOT NULL,
    first_utc    timestamptz NOT NULL DEFAULT now(),
    updated_utc  timestamptz NOT NULL DEFAULT now()
);
CREATE INDEX ix_chains_station ON chains (station);

-- Every run id once, factory-wide. A unique key of a partitioned table must contain the partition key, so the run
-- id's uniqueness (ON CONFLICT on the run id) lives here, beside the record hash it arrived with.
CREATE TABLE run_ids (
    run_id        uuid        PRIMARY KEY,
    chain_id      uuid        NOT NULL REFERENCES chains (chain_id),
    station_seq   bigint      NOT NULL,
    ended_utc     timestamptz NOT NULL,
    record_sha256 text        NOT NULL,
    UNIQUE (chain_id, station_seq)
);

-- Runs, partitioned by the month they ended in (UTC). ended_ticks keeps the station's exact instant (100 ns);
-- reports order by (ended_ticks, station, chain_id, station_seq), which is the primary key.
CREATE TABLE runs (
    ended_utc             timestamptz NOT NULL,
    ended_ticks           bigint      NOT NULL,
    station               text        COLLATE "C" NOT NULL,
    chain_id              uuid        NOT NULL,
    station_seq           bigint      NOT NULL,
    run_id                uuid        NOT NULL,
    serial                text        NOT NULL,
    verdict               text        NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')),
    started_utc           text        NOT NULL,
    product               text        NOT NULL,
    sequence_id           text        COLLATE "C" NOT NULL,
    sequence_revision     integer     NOT NULL,
    sequence_sha256       text        NOT NULL,
    fixture               text        NOT NULL,
    slot                  integer     NOT NULL,
    lot                   text        COLLATE "C",
    operator              text,
    batch_id              text,
    mode                  text        NOT NULL,
    reason                text,
    first_failing_reading text,
    reading_count         integer     NOT NULL,
    prev_sha256           text        NOT NULL,
    record_sha256         text        NOT NULL,
    run_json              text        NOT NULL,
    received_utc          timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (ended_ticks, station, chain_id, station_seq, ended_utc)
) PARTITION BY RANGE (ended_utc);
CREATE INDEX ix_runs_chain ON runs (chain_id, station_seq);
CREATE INDEX ix_runs_serial ON runs (serial);
CREATE INDEX ix_runs_lot ON runs (lot, ended_utc);
CREATE INDEX ix_runs_station ON runs (station, ended_utc);

-- Readings, partitioned like their runs and carrying the run's order key, so a report reads them in run order
-- from the primary key without a join or a sort. Non-finite values are stored as NULL (a report counts them as
-- missing either way).
CREATE TABLE readings (
    ended_utc            timestamptz      NOT NULL,
    ended_ticks          bigint           NOT NULL,
    station              text             COLLATE "C" NOT NULL,
    chain_id             uuid             NOT NULL,
    station_seq          bigint           NOT NULL,
    ordinal              integer          NOT NULL,
    name                 text             COLLATE "C" NOT NULL,
    value                double precision,
    unit                 text             NOT NULL,
    low                  double precision,
    high                 double precision,
    verdict              text             NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')),
    step                 text,
    setpoint             text,
    uncertainty          double precision,
    acceptance_low       double precision,
    acceptance_high      double precision,
    PRIMARY KEY (ended_ticks, station, chain_id, station_seq, ordinal, ended_utc)
) PARTITION BY RANGE (ended_utc);
CREATE INDEX ix_readings_name ON readings (name, ended_utc);

-- Records refused at the door: an id that arrived again with another hash, a record whose hash does not match
-- its text, a run that does not continue its station's chain. Never overwritten, never deleted by LineTest.
CREATE TABLE alarms (
    id             bigserial   PRIMARY KEY,
    raised_utc     timestamptz NOT NULL DEFAULT now(),
    kind           text        NOT NULL,
    station        text,
    chain_id       uuid,
    station_seq    bigint,
    run_id         uuid,
    stored_sha256  text,
    offered_sha256 text,
    detail         text        NOT NULL
);
CREATE INDEX ix_alarms_raised ON alarms (raised_utc);

-- Creates the month partitions of runs and readings that hold instant "at" (UTC months), once. Serialised by an
-- advisory lock so stations forwarding at once do not race to create the same month.
CREATE FUNCTION linetest_ensure_month(at timestamptz) RETURNS void
LANGUAGE plpgsql AS $$
DECLARE
    month_start timestamptz := date_trunc('month', at AT TIME ZONE 'UTC') AT TIME ZONE 'UTC';
    month_end   timestamptz := (date_trunc('month', at AT TIME ZONE 'UTC') + interval '1 month') AT TIME ZONE 'UTC';
    suffix      text        := to_char(at AT TIME ZONE 'UTC', 'YYYY"m"MM');
BEGIN
    PERFORM pg_advisory_xact_lock(hashtext('linetest_ensure_month'));
    IF to_regclass('runs_' || suffix) IS NULL THEN
        EXECUTE format('CREATE TABLE %I PARTITION OF runs FOR VALUES FROM (%L) TO (%L)', 'runs_' || suffix, month_start, month_end);
    END IF;
    IF to_regclass('readings_' || suffix) IS NULL THEN
        EXECUTE format('CREATE TABLE %I PARTITION OF readings FOR VALUES FROM (%L) TO (%L)', 'readings_' || suffix, month_start, month_end);
    END IF;
END;
$$;
