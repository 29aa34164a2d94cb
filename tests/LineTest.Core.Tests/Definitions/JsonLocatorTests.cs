using System.Text;
using CsCheck;
using LineTest.Core.Definitions;
using LineTest.Core.Tests.TestData;

namespace LineTest.Core.Tests.Definitions;

public sealed class JsonLocatorTests
{
    // Line numbers are written beside each line so the expectations below can be checked by eye.
    private const string Nested = """
        {
          "id": "x",
          "stability": {
            "bandC": 0.05,
            "windowSeconds": 60
          },
          "steps": [
            { "kind": "identify" },
            {
              "kind": "measure",
              "setpoint": "cal-low",
              "outputLimits": {
                "low": 0.05,
                "high": 2.5
              }
            },
            [ 1,
              2 ]
          ],
          "odd key": { "inner": true },
          "empty": {},
          "none": []
        }
        """;

    public static TheoryData<string, int> NestedLines => new()
    {
        { "$", 1 },
        { "$.id", 2 },
        { "$.stability", 3 },
        { "$.stability.bandC", 4 },
        { "$.stability.windowSeconds", 5 },
        { "$.steps", 7 },
        { "$.steps[0]", 8 },
        { "$.steps[0].kind", 8 },
        { "$.steps[1]", 9 },
        { "$.steps[1].kind", 10 },
        { "$.steps[1].setpoint", 11 },
        { "$.steps[1].outputLimits", 12 },
        { "$.steps[1].outputLimits.low", 13 },
        { "$.steps[1].outputLimits.high", 14 },
        { "$.steps[2]", 17 },
        { "$.steps[2][0]", 17 },
        { "$.steps[2][1]", 18 },
        { "$['odd key']", 20 },
        { "$['odd key'].inner", 20 },
        { "$.empty", 21 },
        { "$.none", 22 },
    };

    public static TheoryData<string, int> MissingPaths => new()
    {
        // A property that is not in the file is reported at the nearest ancestor that is.
        { "$.stability.maxDriftCPerMinute", 3 },
        { "$.steps[1].outputLimits.unit", 12 },
        { "$.steps[1].samples", 9 },
        { "$.steps[7]", 7 },
        { "$.steps[7].setpoint", 7 },
        { "$.trim.dac.gain.nominal", 1 },
        { "$.empty.anything", 21 },
        { "$['odd key'].other", 20 },
    };

    [Theory]
    [MemberData(nameof(NestedLines))]
    public void LineOf_PathInTheFile_IsTheLineOfItsKeyOrElement(string path, int line)
    {
        var locator = JsonLocator.Build(TestFiles.Utf8(Nested));

        Assert.Equal(line, locator.LineOf(path));
    }

    [Theory]
    [MemberData(nameof(MissingPaths))]
    public void LineOf_MissingPath_FallsBackToItsParentsLine(string path, int line)
    {
        var locator = JsonLocator.Build(TestFiles.Utf8(Nested));

        Assert.Equal(line, locator.LineOf(path));
    }

    [Fact]
    public void LineOf_OddKey_UsesTheSerialisersBracketNotation()
    {
        // System.Text.Json writes keys that are not plain identifiers as ['key'] in JsonException.Path, so the
        // locator must name them the same way for syntax problems to find their line.
        var json = TestFiles.Utf8("{\n  \"a-b\": {\n    \"c\": 1\n  }\n}");

        var locator = JsonLocator.Build(json);

        Assert.Equal(2, locator.LineOf("$['a-b']"));
        Assert.Equal(3, locator.LineOf("$['a-b'].c"));
    }

    [Fact]
    public void LineOf_CommentsAndTrailingCommas_AreSkipped()
    {
        var json = TestFiles.Utf8("{\n  // first\n  \"a\": 1, /* two */\n  \"b\": [\n    3,\n  ],\n}");

        var locator = JsonLocator.Build(json);

        Assert.Equal(3, locator.LineOf("$.a"));
        Assert.Equal(4, locator.LineOf("$.b"));
        Assert.Equal(5, locator.LineOf("$.b[0]"));
    }

    [Fact]
    public void LineOf_ByteOrderMark_IsIgnored()
    {
        // Regression: a UTF-8 byte-order mark stopped the locator at the first byte, so no path had a line.
        var json = Encoding.UTF8.GetPreamble().Concat(TestFiles.Utf8("{\n  \"a\": {\n    \"b\": 1\n  }\n}")).ToArray();

        var locator = JsonLocator.Build(json);

        Assert.Equal(1, locator.LineOf("$"));
        Assert.Equal(3, locator.LineOf("$.a.b"));
    }

    [Fact]
    public void LineOf_MalformedText_KnowsThePartBeforeTheError()
    {
        var json = TestFiles.Utf8("{\n  \"a\": 1,\n  \"b\": [ 2,\n  \"c\" oops\n}");

        var locator = JsonLocator.Build(json);

        Assert.Equal(2, locator.LineOf("$.a"));
        Assert.Equal(3, locator.LineOf("$.b[0]"));
        Assert.Equal(1, locator.LineOf("$.z"));
    }

    [Fact]
    public void LineOf_EmptyText_IsUnknown()
    {
        Assert.Null(JsonLocator.Build([]).LineOf("$.a"));
    }

    [Fact]
    public void LineOf_WindowsLineEndings_CountLikeUnixOnes()
    {
        var locator = JsonLocator.Build(TestFiles.Utf8(Nested.ReplaceLineEndings("\r\n")));

        Assert.Equal(14, locator.LineOf("$.steps[1].outputLimits.high"));
    }

    [Fact]
    public void LineOf_MultiByteCharactersBeforeAKey_DoNotShiftLines()
    {
        var locator = JsonLocator.Build(TestFiles.Utf8("{\n  \"text\": \"±0.5 °C — ok\",\n  \"next\": 1\n}"));

        Assert.Equal(3, locator.LineOf("$.next"));
    }

    [Fact]
    public void LineOf_ArrayOfValuesOnePerLine_EachElementOnItsLine()
    {
        // Property: for any array written one element per line after "[" on line 2, element i is on line i + 3.
        Gen.Int[-1000, 1000].Array[1, 40].Sample(values =>
        {
            var text = "{\n  \"v\": [\n" + string.Join(",\n", values.Select(v => $"    {v}")) + "\n  ]\n}";
            var locator = JsonLocator.Build(TestFiles.Utf8(text));
            for (var i = 0; i < values.Length; i++)
            {
                Assert.Equal(i + 3, locator.LineOf($"$.v[{i}]"));
            }
        });
    }
}
