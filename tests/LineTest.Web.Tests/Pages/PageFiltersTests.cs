using LineTest.Web.Pages;

namespace LineTest.Web.Tests.Pages;

public sealed class PageFiltersTests
{
    // Found in review of the factory report's COPY path: filters are written into the statement as text literals there,
    // and a NUL (/yield?lot=%00 on a page over the factory database) threw past the page's error handling.
    [Theory]
    [InlineData("LOT\0A", "lot")]
    [InlineData("ST\u000101", "station")]
    public void ToQuery_ControlCharacterInAFilter_IsAProblemNotAQuery(string value, string name)
    {
        var filters = name == "lot" ? new PageFilters { Lot = value } : new PageFilters { Station = value };

        var (query, problems) = filters.ToQuery([]);

        Assert.Null(query);
        Assert.Contains(problems, p => p.StartsWith($"'{name}' holds a control character", StringComparison.Ordinal));
    }

    [Fact]
    public void ToQuery_PlainFilters_GiveTheQuery()
    {
        var (query, problems) = new PageFilters { Station = "ST-02", Lot = "LOT-7", From = "2026-12-01", To = "2026-12-03" }.ToQuery([]);

        Assert.Empty(problems);
        Assert.Equal("ST-02", query!.Station);
        Assert.Equal("LOT-7", query.Lot);
        Assert.Equal(new DateTimeOffset(2026, 12, 4, 0, 0, 0, TimeSpan.Zero), query.ToUtc);
    }
}
