using LineTest.Web.Access;

namespace LineTest.Web.Tests.Access;

public sealed class SecretHashTests
{
    [Fact]
    public void Sha256Hex_Abc_PublishedDigest()
    {
        // [published] FIPS 180-2, appendix B.1: SHA-256("abc").
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", SecretHash.Sha256Hex("abc"));
    }

    [Fact]
    public void TokenMatches_RightAndWrongToken()
    {
        var stored = SecretHash.Sha256Hex("t0ken").ToUpperInvariant();

        Assert.True(SecretHash.TokenMatches("t0ken", stored));
        Assert.False(SecretHash.TokenMatches("t0ken ", stored));
        Assert.False(SecretHash.TokenMatches("t0ken", "not hex"));
    }

    [Fact]
    public void PasswordMatches_Rfc7914Pbkdf2Sha256Vector()
    {
        // [published] RFC 7914 §11: PBKDF2-HMAC-SHA256, P = "passwd", S = "salt", c = 1, dkLen = 64.
        var expected = Convert.FromHexString(
            "55ac046e56e3089fec1691c22544b605f94185216dde0465e68b9d57c20dacbc49ca9cccf179b645991664b39d77ef317c71b845b1e30bd509112041d3a19783");
        var stored = "pbkdf2-sha256$1$" + Convert.ToBase64String("salt"u8.ToArray()) + "$" + Convert.ToBase64String(expected);

        Assert.True(SecretHash.PasswordMatches("passwd", stored));
        Assert.False(SecretHash.PasswordMatches("passwe", stored));
    }

    [Fact]
    public void HashPassword_SaltedEachTime_AndMatches()
    {
        var a = SecretHash.HashPassword("block-at-40", iterations: 1000);
        var b = SecretHash.HashPassword("block-at-40", iterations: 1000);

        Assert.NotEqual(a, b);
        Assert.True(SecretHash.PasswordMatches("block-at-40", a));
        Assert.Null(SecretHash.CheckPasswordHash(a));
        Assert.NotNull(SecretHash.CheckPasswordHash("sha256:abc"));
    }
}
