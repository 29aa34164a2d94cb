using LineTest.Storage.Chain;

namespace LineTest.Storage.Tests.Chain;

public sealed class RecordHashTests
{
    [Fact]
    public void Compute_SplitOfAbc_EqualsSha256OfAbc()
    {
        // SHA-256("abc") = ba7816bf…f20015ad: FIPS 180-2, Appendix B.1 (one-block message) [published].
        // The record hash is SHA-256 over run_json followed by the previous hash, so "ab" + "c" hashes "abc".
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", RecordHash.Compute("ab", "c"));
    }

    [Fact]
    public void Compute_EmptyInput_EqualsSha256OfEmptyMessage()
    {
        // SHA-256("") = e3b0c442…7852b855: NIST CAVP SHA-256 short-message test vector, Len = 0 [published].
        Assert.Equal("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855", RecordHash.Compute(string.Empty, string.Empty));
    }

    [Fact]
    public void Compute_NonAsciiText_HashesUtf8Bytes()
    {
        var expected = Convert.ToHexStringLower(System.Security.Cryptography.SHA256.HashData("{\"unit\":\"°C\"}0"u8));

        Assert.Equal(expected, RecordHash.Compute("{\"unit\":\"°C\"}", "0"));
    }

    [Fact]
    public void Genesis_IsSixtyFourZeros()
    {
        Assert.Equal(new string('0', 64), RecordHash.Genesis);
    }
}
