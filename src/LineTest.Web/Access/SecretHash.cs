using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace LineTest.Web.Access;

/// <summary>
/// How page credentials are stored: an access token as its SHA-256 (a token is long and random, so one hash is
/// enough), a password as PBKDF2-HMAC-SHA256 with a salt and many iterations (RFC 8018), written
/// <c>pbkdf2-sha256$ITERATIONS$SALT$HASH</c> with base64 salt and hash. Comparisons take constant time.
/// </summary>
public static class SecretHash
{
    /// <summary>Iterations for new password hashes (OWASP's 2023 figure for PBKDF2-HMAC-SHA256 [common practice]).</summary>
    public const int DefaultIterations = 600_000;

    private const string Scheme = "pbkdf2-sha256";

    /// <summary>SHA-256 of the UTF-8 text, lower-case hex (the form of <c>Station:Web:TokenSha256</c>).</summary>
    public static string Sha256Hex(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)));
    }

    /// <summary>True when <paramref name="token"/> hashes to <paramref name="storedSha256Hex"/> (any letter case).</summary>
    public static bool TokenMatches(string token, string storedSha256Hex)
    {
        ArgumentNullException.ThrowIfNull(token);
        ArgumentNullException.ThrowIfNull(storedSha256Hex);
        byte[] stored;
        try
        {
            stored = Convert.FromHexString(storedSha256Hex.Trim());
        }
        catch (FormatException)
        {
            return false;
        }

        return stored.Length == 32 && CryptographicOperations.FixedTimeEquals(SHA256.HashData(Encoding.UTF8.GetBytes(token)), stored);
    }

    /// <summary>A new password hash with a random 16-byte salt.</summary>
    public static string HashPassword(string password, int iterations = DefaultIterations)
    {
        ArgumentNullException.ThrowIfNull(password);
        ArgumentOutOfRangeException.ThrowIfLessThan(iterations, 1);
        var salt = RandomNumberGenerator.GetBytes(16);
        var hash = Rfc2898DeriveBytes.Pbkdf2(password, salt, iterations, HashAlgorithmName.SHA256, 32);
        return string.Create(CultureInfo.InvariantCulture, $"{Scheme}${iterations}${Convert.ToBase64String(salt)}${Convert.ToBase64String(hash)}");
    }

    /// <summary>Why <paramref name="stored"/> is not a password hash this class reads, or null when it is.</summary>
    public static string? CheckPasswordHash(string stored)
    {
        ArgumentNullException.ThrowIfNull(stored);
        return TryParse(stored, out _, out _, out _) ? null : $"is not {Scheme}$ITERATIONS$SALT$HASH (make one with 'linetest serve --hash-password')";
    }

    /// <summary>True when <paramref name="password"/> matches <paramref name="stored"/>.</summary>
    public static bool PasswordMatches(string password, string stored)
    {
        ArgumentNullException.ThrowIfNull(password);
        ArgumentNullException.ThrowIfNull(stored);
        if (!TryParse(stored, out var iterations, out var salt, out var expected))
        {
            return false;
        }

        var actual = Rfc2898DeriveBytes.Pbkdf2(password, salt, iterations, HashAlgorithmName.SHA256, expected.Length);
        return CryptographicOperations.FixedTimeEquals(actual, expected);
    }

    private static bool TryParse(string stored, out int iterations, out byte[] salt, out byte[] hash)
    {
        iterations = 0;
        salt = [];
        hash = [];
        var parts = stored.Trim().Split('$');
        if (parts.Length != 4 || parts[0] != Scheme
            || !int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out iterations) || iterations < 1)
        {
            return false;
        }

        try
        {
            salt = Convert.FromBase64String(parts[2]);
            hash = Convert.FromBase64String(parts[3]);
        }
        catch (FormatException)
        {
            return false;
        }

        // New hashes carry a 16-byte salt; shorter ones are read (RFC 7914's test vector uses 4 bytes) but never made here.
        return salt.Length >= 4 && hash.Length >= 16;
    }
}
