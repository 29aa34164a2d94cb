using System.Security.Cryptography;
using System.Text;

namespace LineTest.Storage.Chain;

/// <summary>
/// The tamper-evidence hash of a stored run: SHA-256 (FIPS 180-4) over the UTF-8 bytes of the stored
/// <c>run_json</c> text followed by the UTF-8 bytes of the previous record's hash in lower-case hex.
/// The first run's previous hash is <see cref="Genesis"/> (64 zeros).
/// </summary>
public static class RecordHash
{
    /// <summary>The previous hash of the first run in a database: 64 zeros.</summary>
    public const string Genesis = "0000000000000000000000000000000000000000000000000000000000000000";

    /// <summary>Computes <c>hex(SHA-256(utf8(runJson) || utf8(previousHash)))</c> in lower case.</summary>
    public static string Compute(string runJson, string previousHash)
    {
        ArgumentNullException.ThrowIfNull(runJson);
        ArgumentNullException.ThrowIfNull(previousHash);
        var byteCount = Encoding.UTF8.GetByteCount(runJson) + Encoding.UTF8.GetByteCount(previousHash);
        var rented = System.Buffers.ArrayPool<byte>.Shared.Rent(byteCount);
        try
        {
            var written = Encoding.UTF8.GetBytes(runJson, rented);
            written += Encoding.UTF8.GetBytes(previousHash, 0, previousHash.Length, rented, written);
            Span<byte> digest = stackalloc byte[SHA256.HashSizeInBytes];
            SHA256.HashData(rented.AsSpan(0, written), digest);
            return Convert.ToHexStringLower(digest);
        }
        finally
        {
            System.Buffers.ArrayPool<byte>.Shared.Return(rented);
        }
    }
}
