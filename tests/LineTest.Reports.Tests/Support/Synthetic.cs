using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Reports.Tests.Support;

/// <summary>
/// A larger seeded database (normal values, a slot offset, a few failures) for page and layout tests; with
/// <c>mixedProducts</c> every third run is of a second product (another sequence), so readings are labelled per product.
/// </summary>
internal static class Synthetic
{
    public static async Task<string> CreateAsync(int runs, int seed, bool mixedProducts = false)
    {
        var directory = Some.TempDirectory();
        var random = new Random(seed);
        double Normal(double mean, double sd) =>
            mean + (sd * Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble()));

        await using var store = SqliteResultStore.Open(directory);
        var start = new DateTimeOffset(2025, 3, 3, 6, 0, 0, TimeSpan.Zero);
        for (var i = 0; i < runs; i++)
        {
            var slot = (i % 4) + 1;
            var output = Normal(0.735 + (slot == 3 ? 0.004 : 0), 0.006);
            var current = Normal(2.5, 0.05);
            var error = Normal(0.02, 0.08);
            var fails = output > 0.75;
            var builder = new RunRecordBuilder()
                .WithSerial($"CTP40-{i:D5}")
                .WithSlot(slot)
                .WithStation(i % 2 == 0 ? "ST-01" : "ST-02")
                .WithLot(i < runs / 2 ? "LOT-A" : "LOT-B")
                .WithSequence(mixedProducts && i % 3 == 2 ? "ctp40r-resistor" : "ctp40a-eol", mixedProducts && i % 3 == 2 ? 1 : 3)
                .StartedAt(start.AddMinutes(i * 9), TimeSpan.FromMinutes(8))
                .WithReadings(
                    new Reading("cold.output", output, "V", 0.70, 0.75, fails ? Verdict.Fail : Verdict.Pass),
                    new Reading("supply.current", current, "mA", null, 4.0, Verdict.Pass),
                    new Reading("verify.error", error, "degC", -0.25, 0.25, Math.Abs(error) > 0.25 ? Verdict.Fail : Verdict.Pass),
                    new Reading("cal.reference.with.a.rather.long.name", Normal(40, 0.01), "degC", null, null, Verdict.Pass));
            if (fails)
            {
                builder = builder.Failing("cold.output", "cold.output above its limit");
            }
            else if (Math.Abs(error) > 0.25)
            {
                builder = builder.Failing("verify.error", "verify.error outside its limits");
            }

            await store.AppendAsync(builder.Build(), CancellationToken.None);
        }

        return directory;
    }
}
