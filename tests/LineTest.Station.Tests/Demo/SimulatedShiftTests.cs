using LineTest.Core.Fixtures;
using LineTest.Core.Results;
using LineTest.Rig.Simulation;
using LineTest.Station.Composition;
using LineTest.Station.Demo;
using LineTest.TestSupport;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Tests.Demo;

public sealed class SimulatedShiftTests
{
    private const int Units = 6;

    [LinuxFact]
    public async Task RunAsync_Serial_SameUnitsSlotsAndVerdictsAsInMemory()
    {
        var fixture = DefinitionFiles.LoadFixture(RepoFiles.Path("fixtures/sim-dryblock-4.json"), TextWriter.Null).Value!;
        var seed = SeedWithADefect(fixture);

        var inMemory = await ShiftAsync(fixture, seed, serial: false);
        var overSerial = await ShiftAsync(fixture, seed, serial: true);

        Assert.Equal(Units, inMemory.Count);
        Assert.Equal(inMemory.Select(r => (r.Serial, r.Slot, r.Verdict)), overSerial.Select(r => (r.Serial, r.Slot, r.Verdict)));
        Assert.Contains(inMemory, r => r.Verdict != Verdict.Pass);
        Assert.Contains(inMemory, r => r.Verdict == Verdict.Pass);
    }

    // The first seed whose first units include a defective one, so the comparison covers more than passes.
    private static int SeedWithADefect(FixtureDefinition fixture)
    {
        for (var seed = 1; ; seed++)
        {
            var factory = new SimulatedUnitFactory(seed, fixture.Simulation!, SimulatedUnitDesign.Ctp40A);
            if (Enumerable.Range(0, Units).Select(_ => factory.NextUnit()).Any(u => u.Defect is UnitDefect.StuckDac or UnitDefect.OpenSensor))
            {
                return seed;
            }
        }
    }

    private static async Task<List<RunRecord>> ShiftAsync(FixtureDefinition fixture, int seed, bool serial)
    {
        var sequence = DefinitionFiles.LoadSequence(RepoFiles.Path("sequences/ctp40a-dac.json"), fixture, TextWriter.Null);
        var results = Directory.CreateTempSubdirectory("linetest-shift-").FullName;
        try
        {
            var runs = new List<RunRecord>();
            var shift = new SimulatedShift(
                new ShiftOptions
                {
                    Fixture = fixture,
                    Sequence = sequence.Value!,
                    SequenceSha256 = sequence.Sha256!,
                    Units = Units,
                    Seed = seed,
                    ResultsDirectory = results,
                    Serial = serial,
                },
                NullLoggerFactory.Instance);
            await shift.RunAsync(runs.Add, default);
            return runs;
        }
        finally
        {
            Directory.Delete(results, recursive: true);
        }
    }
}
