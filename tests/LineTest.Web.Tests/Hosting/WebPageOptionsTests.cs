using LineTest.Web.Access;
using LineTest.Web.Hosting;

namespace LineTest.Web.Tests.Hosting;

public sealed class WebPageOptionsTests
{
    private static readonly ListenAddress Everywhere = ListenAddress.Parse("0.0.0.0:5080", out _)!;

    [Fact]
    public void Validate_NonLoopbackWithoutCredential_RefusesSayingWhy()
    {
        var problems = new WebPageOptions().Validate(Everywhere);

        var problem = Assert.Single(problems);
        Assert.Contains("listening on 0.0.0.0:5080 lets other computers connect, so a credential is needed", problem, StringComparison.Ordinal);
        Assert.Contains("Station:Web:TokenSha256", problem, StringComparison.Ordinal);
    }

    [Fact]
    public void Validate_LoopbackWithoutCredential_Fine()
    {
        Assert.Empty(new WebPageOptions().Validate(ListenAddress.Default));
    }

    [Fact]
    public void Validate_NonLoopbackWithToken_Fine()
    {
        Assert.Empty(new WebPageOptions { TokenSha256 = SecretHash.Sha256Hex("x") }.Validate(Everywhere));
    }

    [Fact]
    public void Validate_EveryProblemInOneList()
    {
        var options = new WebPageOptions
        {
            TokenSha256 = "plain-token-not-a-hash",
            User = "qe",
            RefreshSeconds = 0,
        };

        var problems = options.Validate(Everywhere);

        Assert.Contains(problems, p => p.StartsWith("Station:Web:TokenSha256 must be 64 hex digits", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.StartsWith("Station:Web:User and Station:Web:PasswordHash go together", StringComparison.Ordinal));
        Assert.Contains(problems, p => p.StartsWith("Station:Web:RefreshSeconds", StringComparison.Ordinal));
    }
}
