using System.Text;

namespace LineTest.Core.Tests.TestData;

/// <summary>
/// Test definition files copied to the output folder: <c>TestData/*.json</c> (copies of the demo files that
/// bad-file tests edit, so a change to the shipped demo does not move their lines) and <c>Shipped/</c> (the
/// committed demo sequence and fixture themselves).
/// </summary>
internal static class TestFiles
{
    public static string SequenceBasePath => Path.Combine(AppContext.BaseDirectory, "TestData", "sequence-base.json");

    public static string FixtureBasePath => Path.Combine(AppContext.BaseDirectory, "TestData", "fixture-base.json");

    public static string ShippedSequencePath => Path.Combine(AppContext.BaseDirectory, "Shipped", "sequences", "ctp40a-dac.json");

    public static string ShippedFixturePath => Path.Combine(AppContext.BaseDirectory, "Shipped", "fixtures", "sim-dryblock-4.json");

    public static string SequenceBase => File.ReadAllText(SequenceBasePath);

    public static string FixtureBase => File.ReadAllText(FixtureBasePath);

    /// <summary>Replaces exactly one occurrence of <paramref name="find"/>; fails the test if it is absent or ambiguous.</summary>
    public static string Edit(string text, string find, string replace)
    {
        var first = text.IndexOf(find, StringComparison.Ordinal);
        Assert.True(first >= 0, $"test data does not contain: {find}");
        Assert.True(text.IndexOf(find, first + 1, StringComparison.Ordinal) < 0, $"test data contains more than once: {find}");
        return string.Concat(text.AsSpan(0, first), replace, text.AsSpan(first + find.Length));
    }

    /// <summary>1-based line of the single occurrence of <paramref name="marker"/>, counted by hand as the oracle.</summary>
    public static int LineOf(string text, string marker)
    {
        var index = text.IndexOf(marker, StringComparison.Ordinal);
        Assert.True(index >= 0, $"text does not contain marker: {marker}");
        Assert.True(text.IndexOf(marker, index + 1, StringComparison.Ordinal) < 0, $"marker is not unique: {marker}");
        return text.AsSpan(0, index).Count('\n') + 1;
    }

    public static byte[] Utf8(string text) => Encoding.UTF8.GetBytes(text);
}
