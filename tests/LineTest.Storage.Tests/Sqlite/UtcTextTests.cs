using LineTest.Storage.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class UtcTextTests
{
    [Fact]
    public void ToText_InstantWithOffset_IsIso8601InUtc()
    {
        // ISO 8601 extended format with Z for UTC [published, ISO 8601-1:2019 §5.3.3].
        var instant = new DateTimeOffset(2025, 1, 1, 1, 30, 0, TimeSpan.FromHours(3)).AddTicks(1234567);

        Assert.Equal("2024-12-31T22:30:00.1234567Z", UtcText.ToText(instant));
    }

    [Fact]
    public void Parse_FormattedInstant_GivesTheSameInstant()
    {
        var instant = new DateTimeOffset(2025, 7, 9, 23, 59, 59, TimeSpan.FromHours(-5)).AddTicks(9999999);

        var back = UtcText.Parse(UtcText.ToText(instant));

        Assert.Equal(instant, back);
        Assert.Equal(TimeSpan.Zero, back.Offset);
    }

    [Fact]
    public void ToText_Instants_SortAsTextInTimeOrder()
    {
        var start = new DateTimeOffset(2025, 1, 1, 0, 0, 0, TimeSpan.Zero);
        var instants = Enumerable.Range(0, 200).Select(i => start.AddSeconds(Math.Pow(1.17, i % 97)).AddTicks(i * 7)).ToList();

        var byText = instants.OrderBy(UtcText.ToText, StringComparer.Ordinal).ToList();

        Assert.Equal(instants.Order(), byText);
    }

    [Theory]
    [InlineData("2025-02-30T00:00:00.0000000Z")]
    [InlineData("2025-03-04T24:00:00.0000000Z")]
    [InlineData("2025-03-04 06:00:00.0000000Z")]
    [InlineData("2025-03-04T06:00:00Z")]
    [InlineData("2025-03-04T06:00:0x.0000000Z")]
    public void Parse_NotTheStoredLayout_ThrowsFormatException(string text)
    {
        Assert.Throws<FormatException>(() => UtcText.Parse(text));
    }

    [Fact]
    public void Parse_ManyInstants_AgreesWithTheFrameworkParser()
    {
        var start = new DateTimeOffset(1999, 12, 31, 23, 59, 59, TimeSpan.Zero);
        for (var i = 0; i < 500; i++)
        {
            var instant = start.AddTicks(i * 987_654_321_987L);
            var text = UtcText.ToText(instant);
            var framework = DateTimeOffset.ParseExact(text, UtcText.Format, System.Globalization.CultureInfo.InvariantCulture, System.Globalization.DateTimeStyles.AssumeUniversal);

            Assert.Equal(framework, UtcText.Parse(text));
        }
    }
}
