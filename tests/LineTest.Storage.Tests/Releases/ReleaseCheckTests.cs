using LineTest.Storage.Releases;

namespace LineTest.Storage.Tests.Releases;

public sealed class ReleaseCheckTests
{
    private static readonly string Released = new('a', 64);
    private static readonly string Changed = new('b', 64);
    private static readonly DateTimeOffset When = new(2026, 3, 16, 6, 0, 0, TimeSpan.Zero);

    [Fact]
    public void Refusal_ReleasedHash_IsNull()
    {
        var list = new[] { new Release("ctp40a-dac", 1, Released, "engineer", When, "a.json") };

        Assert.Null(ReleaseCheck.Refusal(list, "ctp40a-dac", 1, Released.ToUpperInvariant(), "a.json"));
    }

    [Fact]
    public void Refusal_RevokedFile_IsRefusedNamingWhoRevokedItAndWhy()
    {
        var list = new[] { new Release("ctp40a-dac", 1, Released, "engineer", When, "a.json") };
        var revoked = new[] { new Revocation(Released, "quality lead", When.AddDays(1), "cold limit wrong") };

        var refusal = ReleaseCheck.Refusal(list, revoked, "ctp40a-dac", 1, Released, "a.json");

        Assert.NotNull(refusal);
        Assert.Contains("was revoked by quality lead", refusal, StringComparison.Ordinal);
        Assert.Contains("cold limit wrong", refusal, StringComparison.Ordinal);
    }

    [Fact]
    public void Refusal_ChangedFileOfAReleasedRevision_NamesBothHashes()
    {
        var list = new[] { new Release("ctp40a-dac", 1, Released, "engineer", When, "a.json") };

        var refusal = ReleaseCheck.Refusal(list, "ctp40a-dac", 1, Changed, "a.json");

        Assert.NotNull(refusal);
        Assert.Contains($"differs from the released ctp40a-dac r1: released {Released}, file {Changed}", refusal, StringComparison.Ordinal);
    }

    [Fact]
    public void Refusal_HashReleasedUnderAnotherRevision_IsRefused()
    {
        var list = new[] { new Release("ctp40a-dac", 1, Released, "engineer", When, "a.json") };

        var refusal = ReleaseCheck.Refusal(list, "ctp40a-dac", 2, Released, "a.json");

        Assert.NotNull(refusal);
        Assert.Contains("has not been released", refusal, StringComparison.Ordinal);
        Assert.Contains("released as ctp40a-dac r1", refusal, StringComparison.Ordinal);
    }

    [Fact]
    public void Refusal_EmptyList_IsRefusedNamingTheFileHash()
    {
        var refusal = ReleaseCheck.Refusal([], "ctp40a-dac", 1, Changed, "a.json");

        Assert.NotNull(refusal);
        Assert.Contains(Changed, refusal, StringComparison.Ordinal);
    }
}
