using LineTest.Core.Results;
using LineTest.Core.Sequences;

namespace LineTest.Core.Tests.Sequences;

public sealed class DispositionSettingsTests
{
    private static readonly DispositionSettings Settings = new()
    {
        Pass = "packing tray",
        Fail = "red reject bin",
        Error = "yellow retest rack",
        ByReading = new Dictionary<string, string> { ["verify.error"] = "retest rack (trim again)", ["iv-low"] = "failure analysis", ["iv-low.rs"] = "rework bench" },
    };

    [Theory]
    [InlineData(Verdict.Pass, null, "packing tray")]
    [InlineData(Verdict.Fail, "supply.current", "red reject bin")]
    [InlineData(Verdict.Fail, "verify.error", "retest rack (trim again)")]
    [InlineData(Verdict.Fail, "iv-low.n", "failure analysis")]
    [InlineData(Verdict.Fail, "iv-low.rs", "rework bench")]
    [InlineData(Verdict.Fail, "iv-lowest.n", "red reject bin")]
    [InlineData(Verdict.Error, "verify.error", "yellow retest rack")]
    public void For_VerdictAndFirstFailingReading_NamesThePlace(Verdict verdict, string? reading, string expected)
    {
        Assert.Equal(expected, Settings.For(verdict, reading));
    }

    [Fact]
    public void For_NothingNamed_IsNull()
    {
        Assert.Null(new DispositionSettings().For(Verdict.Fail, "verify.error"));
    }
}
