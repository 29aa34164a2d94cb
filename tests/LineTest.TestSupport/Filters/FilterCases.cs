using CsCheck;
using LineTest.Core.Results;
using LineTest.TestSupport.Builders;

namespace LineTest.TestSupport.Filters;

/// <summary>
/// Generators for checking that a filter written as SQL selects the same runs as the filter written in C#: runs whose
/// fields come from small sets (so that filters hit them), end times on and next to the filters' boundaries (one tick,
/// 100 ns, either side, and a microsecond apart), lots that may be missing, and filters with any set of conditions.
/// </summary>
public static class FilterCases
{
    private static readonly DateTimeOffset Day = new(2026, 11, 30, 0, 0, 0, TimeSpan.Zero);

    /// <summary>Boundaries the filters use.</summary>
    private static readonly DateTimeOffset[] Boundaries = [Day.AddHours(6), Day.AddHours(14), Day.AddHours(22), Day.AddDays(1).AddHours(6)];

    /// <summary>Offsets of run end times from a boundary, in ticks.</summary>
    private static readonly long[] Offsets = [-TimeSpan.TicksPerMinute, -10, -1, 0, 1, 10, TimeSpan.TicksPerHour];

    private static readonly string[] Stations = ["ST-01", "ST-02"];

    private static readonly string?[] Lots = ["L-1", "L-2", null];

    private static readonly (string Id, int Revision)[] Sequences = [("ctp40a-dac", 2), ("ctp40a-dac", 3), ("ctp40r-resistor", 1)];

    private static readonly string[] Serials = ["CTP40A-2612-000001", "CTP40A-2612-000002", "CTP40A-2612-000003"];

    /// <summary>One run.</summary>
    public static Gen<RunRecord> Run { get; } =
        Gen.Select(Gen.Int[0, Boundaries.Length - 1], Gen.Int[0, Offsets.Length - 1], Gen.Int[0, Stations.Length - 1], Gen.Int[1, 4], Gen.Int[0, Lots.Length - 1], Gen.Int[0, Sequences.Length - 1], Gen.Int[0, Serials.Length - 1])
            .Select(g =>
            {
                var ended = Boundaries[g.Item1].AddTicks(Offsets[g.Item2]);
                return new RunRecordBuilder()
                    .WithSerial(Serials[g.Item7]).WithStation(Stations[g.Item3]).WithSlot(g.Item4).WithLot(Lots[g.Item5])
                    .WithSequence(Sequences[g.Item6].Id, Sequences[g.Item6].Revision)
                    .StartedAt(ended - TimeSpan.FromMinutes(10), TimeSpan.FromMinutes(10)).Build();
            });

    /// <summary>One filter: each condition set or not, from the same values as the runs (and one value no run has).</summary>
    public static Gen<FilterCase> Filter { get; } =
        Gen.Select(
            Gen.Select(Gen.Int[-1, Boundaries.Length - 1], Gen.Int[-1, Boundaries.Length - 1], Gen.Int[-1, Stations.Length], Gen.Int[-1, 5]),
            Gen.Select(Gen.Int[-1, Lots.Length - 2], Gen.Int[-1, Sequences.Length - 1], Gen.Int[-1, Sequences.Length - 1], Gen.Int[-1, Serials.Length - 1]))
            .Select(g =>
            {
                var ((from, to, station, slot), (lot, sequence, revision, serial)) = g;
                return new FilterCase(
                    from < 0 ? null : Boundaries[from],
                    to < 0 ? null : Boundaries[to],
                    station < 0 ? null : station < Stations.Length ? Stations[station] : "ST-99",
                    slot < 0 ? null : slot,
                    lot < 0 ? null : Lots[lot],
                    sequence < 0 ? null : Sequences[sequence].Id,
                    revision < 0 ? null : Sequences[revision].Revision,
                    serial < 0 ? null : Serials[serial]);
            });
}
