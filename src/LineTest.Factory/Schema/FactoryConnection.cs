using Npgsql;

namespace LineTest.Factory.Schema;

/// <summary>Builds data sources from a connection string and names the database without its password.</summary>
public static class FactoryConnection
{
    /// <summary>A data source for <paramref name="connectionString"/>.</summary>
    /// <exception cref="ArgumentException">The connection string cannot be parsed; the message says which part.</exception>
    public static NpgsqlDataSource Create(string connectionString)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(connectionString);
        var builder = new NpgsqlConnectionStringBuilder(connectionString);
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
