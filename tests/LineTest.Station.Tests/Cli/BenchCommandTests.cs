using System.Text.Json;

namespace LineTest.Station.Tests.Cli;

public sealed class BenchCommandTests
{
    [Fact]
    public async Task Bench_Json_GivesEveryDemoSequenceWithItsFiguresAndTheShift()
    {
        var (exit, output, error) = await CliRunner.RunAsync("bench", "--batches", "1", "--shift-units", "8", "--json");

        Assert.True(exit == 0, error);
        using var json = JsonDocument.Parse(output);
        var sequences = json.RootElement.GetProperty("sequences").EnumerateArray().ToList();
        Assert.Equal(["ctp40a-dac", "ctp40r-resistor", "ctp40d-firmware"], sequences.Select(s => s.GetProperty("sequence").GetString()));
        foreach (var s in sequences)
        {
            Assert.Equal(
                ["sequence", "units", "batches", "baselineUnitsPerHour", "unitsPerHour", "boundUnitsPerHour", "ratioToBound", "ratioToBaseline", "aborted"],
                s.EnumerateObject().Select(p => p.Name));
            var baseline = s.GetProperty("baselineUnitsPerHour").GetDouble();
            var lineTest = s.GetProperty("unitsPerHour").GetDouble();
            var bound = s.GetProperty("boundUnitsPerHour").GetDouble();

            // The bound is a bound: no schedule beats it; four slots with waits judged from readings beat one unit on
            // fixed waits.
            Assert.InRange(lineTest, baseline, bound);
            Assert.Equal(JsonValueKind.Null, s.GetProperty("aborted").ValueKind);
        }

        var shift = json.RootElement.GetProperty("shift");
        Assert.Equal(8, shift.GetProperty("units").GetInt32());
        Assert.True(shift.GetProperty("storedRuns").GetBoolean());
        Assert.True(shift.GetProperty("peakWorkingSetMegabytes").GetDouble() > 0);
        var engineOnly = json.RootElement.GetProperty("engineOnly");
        Assert.Equal(8, engineOnly.GetProperty("units").GetInt32());
        Assert.False(engineOnly.GetProperty("storedRuns").GetBoolean());
    }

    [Fact]
    public async Task Bench_NoBatches_IsBadInput()
    {
        var (exit, _, error) = await CliRunner.RunAsync("bench", "--batches", "0");

        Assert.Equal(2, exit);
        Assert.Contains("--batches must be 1 or more", error, StringComparison.Ordinal);
    }
}
