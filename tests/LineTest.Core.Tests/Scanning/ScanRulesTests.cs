using LineTest.Core.Scanning;

namespace LineTest.Core.Tests.Scanning;

public sealed class ScanRulesTests
{
    private readonly ScanRules _rules = new("^CTP40A-[0-9]{4}-[0-9]{6}$");

    [Fact]
    public void Check_NewSerial_Accepted()
    {
        var decision = _rules.Check("CTP40A-2612-000001", [], SerialHistory.None);

        Assert.True(decision.Accepted);
        Assert.False(decision.IsRetest);
    }

    [Fact]
    public void Check_ScannerSuffixAndBlanks_AreIgnored()
    {
        var decision = _rules.Check("  CTP40A-2612-000001\r", [], SerialHistory.None);

        Assert.True(decision.Accepted);
        Assert.Equal("CTP40A-2612-000001", decision.Serial);
    }

    [Theory]
    [InlineData("CTP40B-2612-000001")]
    [InlineData("CTP40A-2612-00001")]
    [InlineData("4006381333931")]
    [InlineData("")]
    public void Check_NotASerialOfThisProduct_RefusedWithReason(string scanned)
    {
        var decision = _rules.Check(scanned, [], SerialHistory.None);

        Assert.False(decision.Accepted);
        Assert.NotNull(decision.Reason);
    }

    [Fact]
    public void Check_AlreadyInFixture_Refused()
    {
        var decision = _rules.Check("CTP40A-2612-000001", ["CTP40A-2612-000001"], SerialHistory.None);

        Assert.False(decision.Accepted);
        Assert.Contains("already loaded", decision.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_PassedToday_Refused()
    {
        var decision = _rules.Check("CTP40A-2612-000001", [], new SerialHistory(1, PassedToday: true));

        Assert.False(decision.Accepted);
        Assert.Contains("already passed today", decision.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_FailedBefore_AcceptedAsRetest()
    {
        var decision = _rules.Check("CTP40A-2612-000001", [], new SerialHistory(2, PassedToday: false));

        Assert.True(decision.Accepted);
        Assert.True(decision.IsRetest);
    }

    [Fact]
    public void Check_PatternThatBacktracksWithoutEnd_RefusedInsteadOfException()
    {
        // Nested quantifiers backtrack exponentially on a near miss (common practice: the classic "evil regex");
        // the match timeout must become a refusal, not an exception that stops the station.
        var rules = new ScanRules("^(a+)+$", TimeSpan.FromMilliseconds(10));

        var decision = rules.Check(new string('a', 40) + "!", [], SerialHistory.None);

        Assert.False(decision.Accepted);
        Assert.Contains("took too long", decision.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_BadSerialWithExample_RefusalShowsTheExampleNotThePattern()
    {
        var rules = new ScanRules("^CTP40A-[0-9]{4}-[0-9]{6}$", example: "CTP40A-2612-000123");

        var decision = rules.Check("CTP40A-26-1", [], SerialHistory.None);

        Assert.Equal("'CTP40A-26-1' is not a serial of this product (expected like CTP40A-2612-000123)", decision.Reason);
    }
}
