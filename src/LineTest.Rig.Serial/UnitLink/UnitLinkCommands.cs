using System.Globalization;
using System.Text.RegularExpressions;

namespace LineTest.Rig.Serial.UnitLink;

/// <summary>
/// The unit-link protocol (our own; see docs/instrument-protocols.md). Every message, both ways, is framed by
/// <see cref="Transport.ChecksumFraming"/>. Replies repeat the command's keyword; refusals are <c>ERR text</c>.
/// </summary>
public static partial class UnitLinkCommands
{
    /// <summary>Identify: answered <c>ID serial,product,firmware</c>.</summary>
    public const string Identify = "ID?";

    /// <summary>Raw sensor value: answered <c>RAW counts</c>.</summary>
    public const string ReadRaw = "RAW?";

    /// <summary>The unit's own temperature output: answered <c>TEMP celsius</c>.</summary>
    public const string ReadTemperature = "TEMP?";

    /// <summary>Stored trim registers: answered <c>TRIM NAME=value,…</c>.</summary>
    public const string ReadBack = "TRIM?";

    /// <summary>Store the working trim registers in non-volatile memory: answered <c>OK</c>.</summary>
    public const string Store = "STORE";

    /// <summary>The keyword of a trim write (<c>TRIM NAME=value,…</c>, answered <c>OK</c>) and of the read-back reply.</summary>
    public const string Trim = "TRIM";

    /// <summary>Acknowledgement.</summary>
    public const string Ok = "OK";

    /// <summary>Prefix of a refusal.</summary>
    public const string ErrorPrefix = "ERR ";

    /// <summary>True for a register name the protocol can carry: an upper-case letter, then letters, digits or '_'.</summary>
    public static bool IsRegisterName(string name) => RegisterName().IsMatch(name);

    /// <summary><c>TRIM NAME=value,…</c> with names in ordinal order, so the same values always make the same bytes.</summary>
    public static string TrimList(IReadOnlyDictionary<string, long> values)
    {
        ArgumentNullException.ThrowIfNull(values);
        foreach (var name in values.Keys)
        {
            if (!IsRegisterName(name))
            {
                throw new ArgumentException($"'{name}' is not a register name the unit link can carry (A–Z, then A–Z, 0–9 or _).", nameof(values));
            }
        }

        return $"{Trim} " + string.Join(',', values.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => string.Create(CultureInfo.InvariantCulture, $"{p.Key}={p.Value}")));
    }

    /// <summary>Parses the <c>NAME=value,…</c> list after <c>TRIM </c>; null when malformed.</summary>
    public static Dictionary<string, long>? ParseTrimList(string list)
    {
        ArgumentNullException.ThrowIfNull(list);
        var values = new Dictionary<string, long>(StringComparer.Ordinal);
        if (list.Length == 0)
        {
            return values;
        }

        foreach (var item in list.Split(','))
        {
            var eq = item.IndexOf('=', StringComparison.Ordinal);
            if (eq < 1 || !IsRegisterName(item[..eq]) || !Transport.WireNumber.TryParseWhole(item.AsSpan(eq + 1), out var value)
                || !values.TryAdd(item[..eq], value))
            {
                return null;
            }
        }

        return values;
    }

    // \z, not $: $ also matches before a final line feed, which would let "GAIN\n" through as a name.
    [GeneratedRegex(@"^[A-Z][A-Z0-9_]*\z", RegexOptions.CultureInvariant)]
    private static partial Regex RegisterName();
}
