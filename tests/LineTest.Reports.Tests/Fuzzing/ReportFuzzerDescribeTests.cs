using LineTest.Reports.Fuzzing;

namespace LineTest.Reports.Tests.Fuzzing;

public sealed class ReportFuzzerDescribeTests
{
    // A 60,000-input database run reported one crash as only "SqliteException: … malformed", with no way to find where
    // it was thrown: the description now names the frame that threw.
    [Fact]
    public void Describe_ThrownException_NamesTypeMessageAndThrowingFrame()
    {
        var ex = Assert.Throws<InvalidOperationException>(ThrowHere);

        var text = ReportFuzzer.Describe(ex);

        Assert.StartsWith("InvalidOperationException: broken (", text, StringComparison.Ordinal);
        Assert.Contains(nameof(ThrowHere), text, StringComparison.Ordinal);
    }

    [Fact]
    public void Describe_ThrownInsideALibrary_NamesTheFirstFrameOfThisProgram()
    {
        var ex = Assert.Throws<FormatException>(ParseHere);

        var text = ReportFuzzer.Describe(ex);

        Assert.Contains("at LineTest.", text, StringComparison.Ordinal);
        Assert.Contains(nameof(ParseHere), text, StringComparison.Ordinal);
    }

    [Fact]
    public void Describe_NeverThrown_TypeAndMessageOnly() =>
        Assert.Equal("IOException: disk", ReportFuzzer.Describe(new IOException("disk")));

    private static void ThrowHere() => throw new InvalidOperationException("broken");

    private static void ParseHere() => _ = int.Parse("not a number", System.Globalization.CultureInfo.InvariantCulture);
}
