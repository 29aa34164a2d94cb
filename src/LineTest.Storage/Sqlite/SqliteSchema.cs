using Microsoft.Data.Sqlite;

namespace LineTest.Storage.Sqlite;

/// <summary>
/// Creates and checks the results schema. <c>PRAGMA user_version</c> holds the schema version so a later
/// LineTest can migrate; <c>PRAGMA application_id</c> marks the file as a LineTest results database.
/// </summary>
internal static class SqliteSchema
{
    /// <summary>The schema version this code writes and reads.</summary>
    public const int CurrentVersion = 3;

    /// <summary>'LTR1' in ASCII: identifies a LineTest results file (SQLite file format, header offset 68).</summary>
    public const int ApplicationId = 0x4C545231;

    private const string CreateV1 = """
        CREATE TABLE runs (
            seq                   INTEGER PRIMARY KEY AUTOINCREMENT,
            id                    TEXT    NOT NULL UNIQUE,
            serial                TEXT    NOT NULL,
            verdict               TEXT    NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')),
            started_utc           TEXT    NOT NULL,
            ended_utc             TEXT    NOT NULL,
            product               TEXT    NOT NULL,
            sequence_id           TEXT    NOT NULL,
            sequence_revision     INTEGER NOT NULL,
            sequence_sha256       TEXT    NOT NULL,
            station               TEXT    NOT NULL,
            fixture               TEXT    NOT NULL,
            slot                  INTEGER NOT NULL,
            lot                   TEXT,
            operator              TEXT,
            batch_id              TEXT,
            mode                  TEXT    NOT NULL,
            reason                TEXT,
            first_failing_reading TEXT,
            reading_count         INTEGER NOT NULL,
            prev_sha256           TEXT    NOT NULL,
            record_sha256         TEXT    NOT NULL,
            run_json              TEXT    NOT NULL
        );
        CREATE INDEX ix_runs_serial ON runs (serial);
        CREATE INDEX ix_runs_ended_utc ON runs (ended_utc);
        CREATE INDEX ix_runs_summary ON runs (
            seq, id, serial, verdict, ended_utc, station, slot, lot, sequence_id, sequence_revision,
            reason, first_failing_reading);
        CREATE TABLE readings (
            run_seq               INTEGER NOT NULL REFERENCES runs (seq),
            ordinal               INTEGER NOT NULL,
            run_id                TEXT    NOT NULL REFERENCES runs (id),
            name                  TEXT    NOT NULL,
            value                 REAL,
            unit                  TEXT    NOT NULL,
            low                   REAL,
            high                  REAL,
            verdict               TEXT    NOT NULL CHECK (verdict IN ('pass', 'fail', 'error')),
            step                  TEXT,
            setpoint              TEXT,
            uncertainty           REAL,
            standard_uncertainty  REAL,
            coverage_factor       REAL,
            decision_rule         TEXT,
            acceptance_low        REAL,
            acceptance_high       REAL,
            samples               INTEGER,
            note                  TEXT,
            at_utc                TEXT,
            PRIMARY KEY (run_seq, ordinal)
        ) WITHOUT ROWID;
        CREATE INDEX ix_readings_run_id ON readings (run_id);
        CREATE INDEX ix_readings_name ON readings (name);
        """;

    // Version 2 adds, without touching the tables of version 1: the journal of runs in progress (one row per unit
    // under test, replaced after every step and deleted in the transaction that appends the finished run) and the
    // release list of production mode.
    private const string AddV2 = """
        CREATE TABLE runs_in_progress (
            id                    TEXT    PRIMARY KEY,
            serial                TEXT    NOT NULL,
            slot                  INTEGER NOT NULL,
            batch_id              TEXT,
            started_utc           TEXT    NOT NULL,
            updated_utc           TEXT    NOT NULL,
            record_json           TEXT    NOT NULL
        );
        CREATE TABLE releases (
            seq                   INTEGER PRIMARY KEY AUTOINCREMENT,
            sequence_id           TEXT    NOT NULL,
            sequence_revision     INTEGER NOT NULL,
            sha256                TEXT    NOT NULL,
            released_by           TEXT    NOT NULL,
            released_utc          TEXT    NOT NULL,
            file                  TEXT    NOT NULL
        );
        CREATE INDEX ix_releases_sha256 ON releases (sha256);
        """;

    // Version 3 adds the revocations of the release list (a revoked file no longer runs in production). Releases,
    // revocations and the journal are proven by results.head (see Proof/HeadFile), not by columns of their own.
    private const string AddV3 = """
        CREATE TABLE release_revocations (
            seq                   INTEGER PRIMARY KEY AUTOINCREMENT,
            sha256                TEXT    NOT NULL,
            revoked_by            TEXT    NOT NULL,
            revoked_utc           TEXT    NOT NULL,
            reason                TEXT    NOT NULL
        );
        CREATE INDEX ix_release_revocations_sha256 ON release_revocations (sha256);
        """;

    /// <summary>
    /// Creates the schema in an empty database or checks an existing one. Never drops or rewrites data.
    /// Returns a plain reason when the file cannot be used, or null.
    /// </summary>
    public static string? EnsureCreated(SqliteConnection connection)
    {
        using var transaction = connection.BeginTransaction(deferred: false);
        var problem = Check(connection, transaction);
        if (problem is not null)
        {
            return problem;
        }

        var version = ReadVersion(connection, transaction);
        if (version == 0)
        {
            Execute(connection, transaction, CreateV1);
            Execute(connection, transaction, $"PRAGMA application_id = {ApplicationId}; PRAGMA user_version = 1;");
            version = 1;
        }

        // One step per version, inside this transaction: a crash mid-migration leaves the file as it was.
        if (version == 1)
        {
            Execute(connection, transaction, AddV2);
            Execute(connection, transaction, "PRAGMA user_version = 2;");
            version = 2;
        }

        if (version == 2)
        {
            Execute(connection, transaction, AddV3);
            Execute(connection, transaction, "PRAGMA user_version = 3;");
        }

        transaction.Commit();
        return null;
    }

    /// <summary>
    /// Checks that the file is a LineTest results database this code understands (an empty file is fine
    /// for a writer). Returns a plain reason, or null.
    /// </summary>
    public static string? Check(SqliteConnection connection, SqliteTransaction? transaction = null, bool emptyAllowed = true)
    {
        var version = ReadVersion(connection, transaction);
        var applicationId = Convert.ToInt64(Scalar(connection, transaction, "PRAGMA application_id;"), System.Globalization.CultureInfo.InvariantCulture);
        if (version == 0)
        {
            var tables = Convert.ToInt64(Scalar(connection, transaction, "SELECT count(*) FROM sqlite_schema;"), System.Globalization.CultureInfo.InvariantCulture);
            if (tables != 0 || applicationId != 0)
            {
                return "it holds other data and is not a LineTest results database";
            }

            return emptyAllowed ? null : "it is empty: no run has been stored in it yet";
        }

        if (applicationId != ApplicationId)
        {
            return "it is not a LineTest results database (its application id does not match)";
        }

        if (version > CurrentVersion)
        {
            return $"it was written by a newer LineTest (schema version {version}); this version reads schema versions up to {CurrentVersion}";
        }

        return null;
    }

    private static long ReadVersion(SqliteConnection connection, SqliteTransaction? transaction) =>
        Convert.ToInt64(Scalar(connection, transaction, "PRAGMA user_version;"), System.Globalization.CultureInfo.InvariantCulture);

    private static object? Scalar(SqliteConnection connection, SqliteTransaction? transaction, string sql)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        return command.ExecuteScalar();
    }

    private static void Execute(SqliteConnection connection, SqliteTransaction transaction, string sql)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }
}
