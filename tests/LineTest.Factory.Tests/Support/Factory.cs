using LineTest.Factory.Forwarding;
using LineTest.Storage.Sqlite;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Factory.Tests.Support;

/// <summary>Small helpers shared by the factory tests.</summary>
public static class Factory
{
    public static FactoryForwarder Forwarder(TestDatabase database, int batchSize = 250) =>
        new(database.DataSource, TimeProvider.System, NullLogger<FactoryForwarder>.Instance, batchSize);

    public static async Task<ForwardResult> ForwardAsync(FactoryForwarder forwarder, string directory)
    {
        await using var outbox = SqliteOutbox.Open(directory);
        return await forwarder.ForwardAsync(outbox);
    }

    /// <summary>The station_seq values the factory holds for <paramref name="station"/>, in seq order.</summary>
    public static async Task<List<long>> SeqsAsync(TestDatabase database, string station)
    {
        await using var command = database.DataSource.CreateCommand("SELECT station_seq FROM runs WHERE station = @s ORDER BY station_seq;");
        command.Parameters.AddWithValue("s", station);
        await using var reader = await command.ExecuteReaderAsync();
        var seqs = new List<long>();
        while (await reader.ReadAsync())
        {
            seqs.Add(reader.GetInt64(0));
        }

        return seqs;
    }
}
