using System.Text.Json;
using LineTest.TestSupport;

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
                ["sequence", "units", "batches", "baselineUnitsPerHour", "unitsPerHour", "boundUnitsPerHour", "ratioToBound", "ratioToBaseline", "aborted",
                    "mode", "windowBoundUnitsPerHour", "ratioToWindowBound"],
                s.EnumerateObject().Select(p => p.Name));
            var baseline = s.GetProperty("baselineUnitsPerHour").GetDouble();
            var lineTest = s.GetProperty("unitsPerHour").GetDouble();
            var bound = s.GetProperty("boundUnitsPerHour").GetDouble();

            // The bound is a bound: no schedule beats it; four slots with waits judged from readings beat one unit on
            // fixed waits.
            Assert.InRange(lineTest, baseline, bound);
            Assert.Equal(JsonValueKind.Null, s.GetProperty("aborted").ValueKind);

            // The demo sequences settle in window mode: their bound is the wait-for-stability bound.
            Assert.Equal("window", s.GetProperty("mode").GetString());
            Assert.Equal(bound, s.GetProperty("windowBoundUnitsPerHour").GetDouble());
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

    [Fact]
    public async Task BenchAccuracy_Json_ArrayWithExactlyTheContractKeysPerSequenceAndFit()
    {
        var (exit, output, error) = await CliRunner.RunAsync(
            "bench", "--accuracy", "--json", "--accuracy-batches", "1", "--sequence", RepoFiles.Path("sequences/ctp40a-dac.json"),
            "--sequence", RepoFiles.Path("sequences/ctp40d-firmware.json"));

        Assert.True(exit == 0, error);
        using var json = JsonDocument.Parse(output);
        var rows = json.RootElement.EnumerateArray().ToList();
        Assert.Equal(
            [("ctp40a-dac", "through-points"), ("ctp40a-dac", "minimax"), ("ctp40d-firmware", "through-points"), ("ctp40d-firmware", "straight-line")],
            rows.Select(r => (r.GetProperty("sequence").GetString(), r.GetProperty("fit").GetString())));
        foreach (var row in rows)
        {
            Assert.Equal(["sequence", "fit", "rmsErrorC", "maxAbsErrorC", "floorRmsC", "ratio", "verifyBiasC"], row.EnumerateObject().Select(p => p.Name));
            Assert.True(row.GetProperty("floorRmsC").GetDouble() > 0);
            // The ratio is of the unrounded figures; rms and floor are printed to 4 decimals, so compare within 1 %.
            var ratio = row.GetProperty("ratio").GetDouble();
            Assert.InRange(row.GetProperty("rmsErrorC").GetDouble() / row.GetProperty("floorRmsC").GetDouble(), ratio * 0.99, ratio * 1.01);
        }
    }

    [Fact]
    public async Task BenchAccuracy_SequenceWithoutRatedRange_IsBadInput()
    {
        var text = File.ReadAllText(RepoFiles.Path("sequences/ctp40a-dac.json"))
            .Replace("\"ratedRange\": { \"lowC\": -20, \"highC\": 40 },", string.Empty, StringComparison.Ordinal)
            .Replace("\"fit\": \"minimax\",", string.Empty, StringComparison.Ordinal);
        var path = Path.Combine(Some.TempDirectory(), "no-range.json");
        File.WriteAllText(path, text);

        var (exit, _, error) = await CliRunner.RunAsync("bench", "--accuracy", "--sequence", path);

        Assert.Equal(2, exit);
        Assert.Contains("states no ratedRange", error, StringComparison.Ordinal);
    }
}
