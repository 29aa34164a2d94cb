using System.Net.Http.Headers;
using System.Text;
using LineTest.Web.Hosting;
using Microsoft.AspNetCore.Http;

namespace LineTest.Web.Access;

/// <summary>
/// Checks a request's credential against the hashes in settings: <c>Authorization: Bearer TOKEN</c>, or HTTP Basic
/// with the configured user and password, or with any name and the token as password (so a browser can log in
/// with the token; the name given is logged as who looked).
/// </summary>
public sealed class WebCredentials
{
    private readonly string? _tokenSha256;
    private readonly string? _user;
    private readonly string? _passwordHash;

    /// <summary>Creates the checker from validated options.</summary>
    public WebCredentials(WebPageOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        _tokenSha256 = string.IsNullOrWhiteSpace(options.TokenSha256) ? null : options.TokenSha256.Trim();
        _user = string.IsNullOrWhiteSpace(options.User) ? null : options.User.Trim();
        _passwordHash = string.IsNullOrWhiteSpace(options.PasswordHash) ? null : options.PasswordHash.Trim();
    }

    /// <summary>Who the request says it is when the credential is right; null otherwise.</summary>
    public string? Authenticate(HttpRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (!AuthenticationHeaderValue.TryParse(request.Headers.Authorization.ToString(), out var header) || header.Parameter is null)
        {
            return null;
        }

        if (header.Scheme.Equals("Bearer", StringComparison.OrdinalIgnoreCase))
        {
            return _tokenSha256 is not null && SecretHash.TokenMatches(header.Parameter, _tokenSha256) ? "token" : null;
        }

        if (!header.Scheme.Equals("Basic", StringComparison.OrdinalIgnoreCase))
        {
            return null;
        }

        string pair;
        try
        {
            pair = Encoding.UTF8.GetString(Convert.FromBase64String(header.Parameter));
        }
        catch (FormatException)
        {
            return null;
        }

        var colon = pair.IndexOf(':', StringComparison.Ordinal);
        if (colon < 0)
        {
            return null;
        }

        var name = pair[..colon];
        var secret = pair[(colon + 1)..];
        if (_user is not null && _passwordHash is not null && string.Equals(name, _user, StringComparison.Ordinal)
            && SecretHash.PasswordMatches(secret, _passwordHash))
        {
            return name;
        }

        return _tokenSha256 is not null && SecretHash.TokenMatches(secret, _tokenSha256)
            ? (string.IsNullOrWhiteSpace(name) ? "token" : name + " (token)")
            : null;
    }
}
