namespace LineTest.Storage.Sqlite;

/// <summary>
/// The outbox of the factory forwarder, added by schema version 4 without touching earlier tables. Runs are only
/// ever appended in <c>seq</c> order and forwarded in that order, so the outbox is the runs after a watermark:
/// <c>outbox_forwarded</c> holds, per factory database, the highest seq that database has committed. The watermark
/// moves only after the server's commit, and never backwards. <c>outbox_source</c> holds this database's chain id,
/// made once, under which the factory keeps this station's hash chain (a copy of the file keeps the same chain).
/// </summary>
internal static class SqliteOutboxSchema
{
    public const string AddV4 = """
        CREATE TABLE IF NOT EXISTS outbox_source (
            only_row              INTEGER PRIMARY KEY CHECK (only_row = 1),
            chain_id              TEXT    NOT NULL
        );
        INSERT OR IGNORE INTO outbox_source (only_row, chain_id) VALUES (1, lower(hex(randomblob(16))));
        CREATE TABLE IF NOT EXISTS outbox_forwarded (
            factory_id            TEXT    PRIMARY KEY,
            through_seq           INTEGER NOT NULL,
            forwarded_utc         TEXT    NOT NULL
        );
        """;
}
