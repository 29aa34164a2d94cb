using LineTest.Web.Access;

namespace LineTest.Web.Hosting;

/// <summary>
/// The <c>Station:Web</c> section of appsettings.json: where the live page listens and who may look at it from
/// another computer. Loopback needs no credential; any other address needs <see cref="TokenSha256"/> or
/// <see cref="User"/> with <see cref="PasswordHash"/>.
/// </summary>
public sealed class WebPageOptions
{
    /// <summary>Configuration section name.</summary>
    public const string Section = "Station:Web";

    /// <summary>
    /// ADDR:PORT the page listens on. For <c>linetest serve</c> the default is 127.0.0.1:5080; the hosted station
    /// serves the page only when this is set.
    /// </summary>
    public string? Listen { get; set; }

    /// <summary>SHA-256 (hex) of the access token; clients send <c>Authorization: Bearer TOKEN</c> or the token as a password.</summary>
    public string? TokenSha256 { get; set; }

    /// <summary>User name for a user/password login (HTTP Basic; use it behind TLS on untrusted networks).</summary>
    public string? User { get; set; }

    /// <summary>The user's password as <c>pbkdf2-sha256$ITERATIONS$SALT$HASH</c> (<c>linetest serve --hash-password</c>).</summary>
    public string? PasswordHash { get; set; }

    /// <summary>Seconds between looks at the results for the live line page. Default 2.</summary>
    public double RefreshSeconds { get; set; } = 2;

    /// <summary>True when a token or a user with a password is configured.</summary>
    public bool HasCredential => !string.IsNullOrWhiteSpace(TokenSha256) || (!string.IsNullOrWhiteSpace(User) && !string.IsNullOrWhiteSpace(PasswordHash));

    /// <summary>Every problem with these options for a page listening on <paramref name="listen"/>, in one list.</summary>
    public IReadOnlyList<string> Validate(ListenAddress listen)
    {
        ArgumentNullException.ThrowIfNull(listen);
        var problems = new List<string>();
        if (!string.IsNullOrWhiteSpace(TokenSha256) && (TokenSha256.Trim().Length != 64 || !TokenSha256.Trim().All(char.IsAsciiHexDigit)))
        {
            problems.Add("Station:Web:TokenSha256 must be 64 hex digits, the SHA-256 of the token (make it with 'linetest serve --hash-token')");
        }

        if (string.IsNullOrWhiteSpace(User) != string.IsNullOrWhiteSpace(PasswordHash))
        {
            problems.Add("Station:Web:User and Station:Web:PasswordHash go together: set both or neither");
        }
        else if (!string.IsNullOrWhiteSpace(PasswordHash) && SecretHash.CheckPasswordHash(PasswordHash) is { } reason)
        {
            problems.Add("Station:Web:PasswordHash " + reason);
        }

        if (!listen.IsLoopback && !HasCredential)
        {
            problems.Add(
                $"listening on {listen} lets other computers connect, so a credential is needed: set Station:Web:TokenSha256 "
                + "(or Station:Web:User and Station:Web:PasswordHash) in appsettings.json, or listen on 127.0.0.1");
        }

        if (!(RefreshSeconds >= 0.1 && RefreshSeconds <= 600))
        {
            problems.Add("Station:Web:RefreshSeconds must be between 0.1 and 600");
        }

        return problems;
    }
}
