using System.Globalization;
using System.Net;

namespace LineTest.Web.Access;

/// <summary>Where the page listens: an IP address (or <c>localhost</c>) and a port, written <c>ADDR:PORT</c>.</summary>
/// <param name="Address">The address; <see cref="IPAddress.Loopback"/> for <c>localhost</c>.</param>
/// <param name="Port">TCP port, 0 for one the system picks (tests).</param>
public sealed record ListenAddress(IPAddress Address, int Port)
{
    /// <summary>The default: loopback only, port 5080.</summary>
    public static ListenAddress Default { get; } = new(IPAddress.Loopback, 5080);

    /// <summary>True when only this computer can connect (127.0.0.0/8 or ::1).</summary>
    public bool IsLoopback => IPAddress.IsLoopback(Address);

    /// <summary>Parses <c>127.0.0.1:5080</c>, <c>0.0.0.0:5080</c>, <c>[::1]:5080</c>, <c>localhost:5080</c>.</summary>
    /// <returns>The address, or null with <paramref name="error"/> saying why not.</returns>
    public static ListenAddress? Parse(string? text, out string? error)
    {
        error = null;
        var trimmed = text?.Trim() ?? string.Empty;
        var colon = trimmed.LastIndexOf(':');
        if (colon <= 0 || colon == trimmed.Length - 1)
        {
            error = $"'{text}' is not ADDR:PORT (e.g. 127.0.0.1:5080 or 0.0.0.0:5080)";
            return null;
        }

        var host = trimmed[..colon];
        var portText = trimmed[(colon + 1)..];
        if (!int.TryParse(portText, NumberStyles.None, CultureInfo.InvariantCulture, out var port) || port > 65535)
        {
            error = $"'{text}': the port '{portText}' is not a number from 0 to 65535";
            return null;
        }

        if (host.StartsWith('[') && host.EndsWith(']'))
        {
            host = host[1..^1];
        }

        if (string.Equals(host, "localhost", StringComparison.OrdinalIgnoreCase))
        {
            return new ListenAddress(IPAddress.Loopback, port);
        }

        if (!IPAddress.TryParse(host, out var address))
        {
            error = $"'{text}': '{host}' is not an IP address (give 127.0.0.1, 0.0.0.0, an interface's address, or localhost)";
            return null;
        }

        return new ListenAddress(address, port);
    }

    /// <summary>ADDR:PORT as typed back, IPv6 in brackets.</summary>
    public override string ToString() =>
        Address.AddressFamily == System.Net.Sockets.AddressFamily.InterNetworkV6
            ? string.Create(CultureInfo.InvariantCulture, $"[{Address}]:{Port}")
            : string.Create(CultureInfo.InvariantCulture, $"{Address}:{Port}");
}
