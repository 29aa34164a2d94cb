using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;
using Microsoft.Data.Sqlite;

namespace LineTest.Factory.Tests.Support;

/// <summary>A station's results folder with a real SQLite store, filled with plausible runs one after another.</summary>
public sealed class StationFolder : IAsyncDisposable
{
    private readonly SqliteResultStore _store;
    private DateTimeOffset _next;
    private int _count;

    public StationFolder(string station, DateTimeOffset start, string? directory = null)
    {
        Station = station;
        Directory = directory ?? Some.TempDirectory();
        _store = SqliteResultStore.Open(Directory);
        _next = start;
    }

    public string Station { get; }

    public string Directory { get; }

    public List<RunRecord> Stored { get; } = [];

    /// <summary>
    /// Stores <paramref name="count"/> runs, 20 minutes apart, every seventh failing and every eleventh an error. With
    /// <paramref name="retests"/>, serials do not name the station and each is tested twice in a row, so a unit has runs
    /// at every station (in the same order at each); runs then name one of two operators (or none, or a blank one) and
    /// every fifth run tests another sequence revision.
    /// </summary>
    public async Task AddRunsAsync(int count, TimeSpan? step = null, bool retests = false)
    {
        for (var i = 0; i < count; i++)
        {
            _count++;
            var builder = new RunRecordBuilder()
                .WithStation(Station)
                .WithSerial(retests ? $"CTP40-{(_count + 1) / 2:D5}" : $"CTP40-{Station}-{_count:D5}")
                .WithSlot(1 + (_count % 4))
                .WithLot(_count % 3 == 0 ? "LOT-B" : "LOT-A")
                .StartedAt(_next, TimeSpan.FromMinutes(14.5));
            if (retests)
            {
                builder = builder
                    .WithOperator((_count % 4) switch { 0 => null, 1 => "  ", _ => $"OP-{_count % 2}" })
                    .WithSequence("ctp40a-eol", _count % 5 == 0 ? 4 : 3);
            }

            if (_count % 7 == 0)
            {
                builder = builder.Failing("verify.error", "verify.error outside limits");
            }
            else if (_count % 11 == 0)
            {
                builder = builder.Erroring("reference thermometer lost");
            }

            var run = builder.Build();
            await _store.AppendAsync(run, CancellationToken.None);
            Stored.Add(run);
            _next += step ?? TimeSpan.FromMinutes(20);
        }
    }

    /// <summary>Runs SQL against the station's database directly (to play an intruder).</summary>
    public void Execute(string sql)
    {
        using var connection = new SqliteConnection($"Data Source={ResultsDatabase.PathIn(Directory)};Pooling=False");
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    public ValueTask DisposeAsync() => _store.DisposeAsync();
}
