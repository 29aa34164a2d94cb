using LineTest.Core.Results;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport;
using LineTest.TestSupport.Builders;

namespace LineTest.Reports.Tests.Support;

/// <summary>
/// A hand-checkable results database: 4 units, 6 runs over 2 slots, three readings (two-sided, upper-only and
/// no limits). Every expected figure in the tests is computed by hand from the values below.
/// </summary>
internal static class SmallLine
{
    public static readonly DateTimeOffset Start = new(2025, 3, 4, 6, 0, 0, TimeSpan.Zero);

    // Run order: U1 pass; U2 fail (offset) then pass; U3 error then fail (offset); U4 pass.
    public static readonly (string Serial, int Slot, Verdict Verdict)[] Runs =
    [
        ("U1", 1, Verdict.Pass), ("U2", 2, Verdict.Fail), ("U2", 2, Verdict.Pass),
        ("U3", 1, Verdict.Error), ("U3", 1, Verdict.Fail), ("U4", 2, Verdict.Pass),
    ];

    /// <summary>offset: limits 0…10 (V).</summary>
    public static readonly double[] Offset = [4.0, 5.5, 6.1, 3.2, 7.0, 4.4];

    /// <summary>leak: upper limit 5 only (uA).</summary>
    public static readonly double[] Leak = [1.0, 1.4, 0.8, 1.1, 1.9, 1.2];

    /// <summary>slope: no limits (mV/degC).</summary>
    public static readonly double[] Slope = [9.9, 10.1, 10.0, 9.8, 10.3, 10.0];

    public static async Task<string> CreateAsync(string? directory = null)
    {
        directory ??= Some.TempDirectory();
        await using var store = SqliteResultStore.Open(directory);
        for (var i = 0; i < Runs.Length; i++)
        {
            var (serial, slot, verdict) = Runs[i];
            var builder = new RunRecordBuilder()
                .WithSerial(serial)
                .WithSlot(slot)
                .StartedAt(Start.AddHours(i), TimeSpan.FromMinutes(10))
                .WithReadings(
                    new Reading("offset", Offset[i], "V", 0, 10, verdict == Verdict.Fail ? Verdict.Fail : Verdict.Pass),
                    new Reading("leak", Leak[i], "uA", null, 5, Verdict.Pass),
                    new Reading("slope", Slope[i], "mV/degC", null, null, Verdict.Pass));
            builder = verdict switch
            {
                Verdict.Fail => builder.Failing("offset", "offset out of limits"),
                Verdict.Error => builder.Erroring("unit silent"),
                _ => builder,
            };
            await store.AppendAsync(builder.Build(), CancellationToken.None);
        }

        return directory;
    }
}
