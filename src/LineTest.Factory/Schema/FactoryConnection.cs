using Npgsql;

namespace LineTest.Factory.Schema;

/// <summary>Builds data sources from a connection string and names the database without its password.</summary>
public static class FactoryConnection
{
    /// <summary>
    /// Read buffer of each connection unless the connection string sets <c>Read Buffer Size</c>: a report streams
    /// millions of rows, and Npgsql's default of 8 KiB means a socket read, and a thread woken, for every hundred rows.
    /// </summary>
    public const int DefaultReadBufferSize = 256 * 1024;

    /// <summary>A data source for <paramref name="connectionString"/>.</summary>
    /// <exception cref="ArgumentException">The connection string cannot be parsed; the message says which part.</exception>
    public static NpgsqlDataSource Create(string connectionString)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(connectionString);
        var builder = new NpgsqlConnectionStringBuilder(connectionString);
        var given = new System.Data.Common.DbConnectionStringBuilder { ConnectionString = connectionString };
        if (!given.ContainsKey("Read Buffer Size") && !given.ContainsKey("ReadBufferSize"))
        {
            builder.ReadBufferSize = DefaultReadBufferSize;
        }

        return new NpgsqlDataSourceBuilder(builder.ConnectionString).Build();
    }

    /// <summary>"postgresql://host:port/database", for reports and messages (never the password).</summary>
    public static string Describe(NpgsqlDataSource dataSource)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        var builder = new NpgsqlConnectionStringBuilder(dataSource.ConnectionString);
        return $"postgresql://{builder.Host}:{builder.Port}/{builder.Database ?? builder.Username}";
    }
}
