using LineTest.Storage.Chain;
using LineTest.Storage.Proof;
using LineTest.TestSupport;

namespace LineTest.Storage.Tests.Proof;

public sealed class HeadFileTests
{
    private static readonly HeadState After = new(
        12, new string('c', 64), 12, 2, new string('d', 64), [new JournalProof("0b6d1b7e-0000-4000-8000-000000000001", new string('e', 64))]);

    [Fact]
    public void Parse_FormattedHead_RoundTripsBothStates()
    {
        var head = new ResultsHead(After, After with { Seq = 11, Sha256 = new string('f', 64), Runs = 11, Journal = [] });

        var parsed = HeadFile.Parse(HeadFile.Format(head), out var problem);

        Assert.Null(problem);
        Assert.NotNull(parsed);
        Assert.True(parsed.Current.SameContent(head.Current));
        Assert.Equal(12, parsed.Current.Runs);
        Assert.True(parsed.Previous!.SameContent(head.Previous!));
        Assert.Empty(parsed.Previous.Journal);
    }

    [Theory]
    [InlineData("", "first line")]
    [InlineData("linetest-head 1\nhead 12:abc\n", "head SEQ:HASH")]
    [InlineData("linetest-head 1\nhead 1:0000000000000000000000000000000000000000000000000000000000000000\nruns x\n", "runs N")]
    public void Parse_NotAHead_SaysWhy(string text, string expected)
    {
        Assert.Null(HeadFile.Parse(text, out var problem));
        Assert.Contains(expected, problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Write_ReplacesTheFileWholeAndLeavesNoTemporaryFile()
    {
        var folder = Some.TempDirectory();

        HeadFile.Write(folder, new ResultsHead(After with { Seq = 1, Sha256 = RecordHash.Genesis }, null));
        HeadFile.Write(folder, new ResultsHead(After, null));

        Assert.Equal(After.Anchor, HeadFile.Read(folder).Head!.Current.Anchor);
        Assert.Equal([HeadFile.FileName], Directory.GetFiles(folder).Select(Path.GetFileName));
    }

    [Theory]
    [InlineData("12:cccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccc", true)]
    [InlineData("12:CCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCCC", true)]
    [InlineData("12:ccc", false)]
    [InlineData("x:cccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccccc", false)]
    [InlineData("12", false)]
    public void ParseAnchor_Text_AcceptsOnlySeqColonSha256(string text, bool valid)
    {
        Assert.Equal(valid, HeadState.ParseAnchor(text) is not null);
    }
}
