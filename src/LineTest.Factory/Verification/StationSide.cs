using LineTest.Storage.Sqlite;
using Microsoft.Data.Sqlite;

namespace LineTest.Factory.Verification;

/// <summary>
/// What a station's own folder says about its chain, read without changing anything: its chain id, the watermark of
/// a factory database, the record hash at a seq, and the head recorded in <c>results.head</c> when the station keeps one.
/// </summary>
public sealed class StationSide
{
    private readonly string _databasePath;

    private StationSide(string databasePath, string? chainId, long forwardedThroughSeq, (long Seq, string Sha256)? headFile)
    {
        _databasePath = databasePath;
        ChainId = chainId;
        ForwardedThroughSeq = forwardedThroughSeq;
        HeadFile = headFile;
    }

    /// <summary>The station database's chain id (32 hex digits), or null when it never had an outbox.</summary>
    public string? ChainId { get; }

    /// <summary>The highest seq the factory database was seen to commit (0 when none).</summary>
    public long ForwardedThroughSeq { get; }

    /// <summary>The <c>head SEQ:HASH</c> line of <c>results.head</c>, when the file exists and has one.</summary>
    public (long Seq, string Sha256)? HeadFile { get; }

    /// <summary>Reads the folder <paramref name="resultsDirectory"/> for the factory database <paramref name="factoryId"/>.</summary>
    /// <exception cref="SqliteException">The database cannot be read.</exception>
    public static StationSide Read(string resultsDirectory, string factoryId)
    {
        var path = ResultsDatabase.PathIn(resultsDirectory);
        if (!File.Exists(path))
        {
            throw new FileNotFoundException($"no results database at {path}", path);
        }

        using var connection = Open(path);
        string? chainId = null;
        long through = 0;
        if (Scalar(connection, "SELECT count(*) FROM sqlite_schema WHERE name = 'outbox_source';", null) is 1L)
        {
            chainId = Scalar(connection, "SELECT chain_id FROM outbox_source;", null) as string;
            through = Scalar(connection, "SELECT through_seq FROM outbox_forwarded WHERE factory_id = $f;", factoryId) as long? ?? 0;
        }

        var head = LineTest.Storage.Proof.HeadFile.Read(Path.GetDirectoryName(path)!).Head?.Current;
        return new StationSide(path, chainId, through, head is null ? null : (head.Seq, head.Sha256));
    }

    /// <summary>The station's record hash of the run at <paramref name="seq"/>, or null when it has none.</summary>
    public string? HashAt(long seq)
    {
        using var connection = Open(_databasePath);
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT record_sha256 FROM runs WHERE seq = $s;";
        command.Parameters.AddWithValue("$s", seq);
        return command.ExecuteScalar() as string;
    }

    private static SqliteConnection Open(string path)
    {
        var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = path, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString());
        connection.Open();
        return connection;
    }

    private static object? Scalar(SqliteConnection connection, string sql, string? factoryId)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        if (factoryId is not null)
        {
            command.Parameters.AddWithValue("$f", factoryId);
        }

        return command.ExecuteScalar();
    }
}
