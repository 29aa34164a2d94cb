using Npgsql;

namespace LineTest.TestSupport.Postgres;

/// <summary>
/// Where the tests find a real PostgreSQL server: <c>LINETEST_TEST_POSTGRES</c> (an Npgsql connection string to a
/// server where databases may be created), exported by <c>.ci/run</c>. Outside CI the tests that need it are skipped
/// with <see cref="SkipReason"/> when it is absent; in CI (<c>CI=true</c>) they run and fail, so a missing server cannot
/// pass.
/// </summary>
public static class TestPostgres
{
    public const string Variable = "LINETEST_TEST_POSTGRES";

    public static string? ConnectionString => Environment.GetEnvironmentVariable(Variable) is { Length: > 0 } value ? value : null;

    public static bool InCi => string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase);

    /// <summary>The skip reason, or null when the tests must run.</summary>
    public static string? SkipReason =>
        ConnectionString is null && !InCi
            ? $"needs a PostgreSQL server: set {Variable} (an Npgsql connection string), as .ci/run does"
            : null;

    public static string Required =>
        ConnectionString ?? throw new InvalidOperationException($"CI=true but {Variable} is not set: .ci/run must start a PostgreSQL server for these tests.");

    /// <summary>Creates the database <paramref name="name"/> on <paramref name="server"/> (default: <see cref="Required"/>); returns its connection string.</summary>
    public static async Task<string> CreateDatabaseAsync(string name, string? server = null)
    {
        server ??= Required;
        await using var admin = new NpgsqlConnection(server);
        await admin.OpenAsync();
        await using var create = new NpgsqlCommand($"CREATE DATABASE {name};", admin);
        await create.ExecuteNonQueryAsync();
        return new NpgsqlConnectionStringBuilder(server) { Database = name }.ConnectionString;
    }

    /// <summary>Drops the database <paramref name="name"/> on <paramref name="server"/> (default: <see cref="Required"/>), closing its pooled connections first.</summary>
    public static async Task DropDatabaseAsync(string name, string? server = null)
    {
        NpgsqlConnection.ClearAllPools();
        await using var admin = new NpgsqlConnection(server ?? Required);
        await admin.OpenAsync();
        await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS {name} WITH (FORCE);", admin);
        await drop.ExecuteNonQueryAsync();
    }
}
