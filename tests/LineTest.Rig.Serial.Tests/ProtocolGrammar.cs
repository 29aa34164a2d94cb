using System.Globalization;
using System.Text.RegularExpressions;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests;

/// <summary>What a reply means: a value, an error the instrument reported, or garbage.</summary>
internal enum ExpectedKind
{
    Value,
    InstrumentError,
    Garbage,
}

/// <summary>The meaning the protocol gives a reply line.</summary>
internal sealed record Expected<T>(ExpectedKind Kind, T? Value, string? Error)
{
    public static Expected<T> Of(T value) => new(ExpectedKind.Value, value, null);

    public static Expected<T> Refused(string error) => new(ExpectedKind.InstrumentError, default, error);

    public static Expected<T> Garbage { get; } = new(ExpectedKind.Garbage, default, null);
}

/// <summary>
/// The reply grammars of docs/instrument-protocols.md written out a second time, as regular expressions, so that the
/// fuzz properties compare each hand-written parser with an independent reading of the protocol.
/// </summary>
internal static partial class ProtocolGrammar
{
    // A decimal number: optional sign, digits with an optional point (or a point and digits), optional exponent;
    // blanks (space, TAB) around it are allowed. No names (Infinity, NaN), no other digits, no other white space.
    private const string NumberPattern = @"[ \t]*[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?[ \t]*";

    /// <summary>A number reply of the source, the readout and the unit link: finite, else garbage.</summary>
    public static Expected<double> FiniteNumber(string text)
        => Number().IsMatch(text) && Parse(text) is var value && double.IsFinite(value) ? Expected<double>.Of(value) : Expected<double>.Garbage;

    /// <summary><see cref="FiniteNumber"/>, or <c>ERR …</c> (source and readout).</summary>
    public static Expected<double> NumberOrError(string text)
        => text.StartsWith("ERR ", StringComparison.Ordinal) ? Expected<double>.Refused(text[4..].Trim()) : FiniteNumber(text);

    /// <summary><c>OK</c>, or <c>ERR …</c> (source and readout).</summary>
    public static Expected<bool> OkOrError(string text)
        => text.StartsWith("ERR ", StringComparison.Ordinal) ? Expected<bool>.Refused(text[4..].Trim())
            : text == "OK" ? Expected<bool>.Of(true) : Expected<bool>.Garbage;

    /// <summary>An IEEE 488.2 identity: four comma-separated fields, none blank.</summary>
    public static Expected<InstrumentIdentity> Identity(string text)
    {
        var fields = text.Split(',');
        return fields.Length == 4 && fields.All(f => !string.IsNullOrWhiteSpace(f))
            ? Expected<InstrumentIdentity>.Of(new InstrumentIdentity(fields[0].Trim(), fields[1].Trim(), fields[2].Trim(), fields[3].Trim()))
            : Expected<InstrumentIdentity>.Garbage;
    }

    /// <summary>The source's <c>SOUR:STAT?</c> reply: <c>setpoint,actual,OK</c> or <c>setpoint,actual,FAULT text</c>.</summary>
    public static Expected<SourceStatus> Status(string text)
    {
        if (text.StartsWith("ERR ", StringComparison.Ordinal))
        {
            return Expected<SourceStatus>.Refused(text[4..].Trim());
        }

        var match = StatusLine().Match(text);
        if (!match.Success || !double.IsFinite(Parse(match.Groups[1].Value)) || !double.IsFinite(Parse(match.Groups[2].Value)))
        {
            return Expected<SourceStatus>.Garbage;
        }

        var fault = match.Groups[3].Value == "OK" ? null : match.Groups[3].Value["FAULT ".Length..];
        return Expected<SourceStatus>.Of(new SourceStatus(Parse(match.Groups[1].Value), Parse(match.Groups[2].Value), fault));
    }

    /// <summary>The readout's <c>MEAS?</c> reply <c>value,unit</c> with the one unit the fixture's sensor needs.</summary>
    public static Expected<double> Measurement(string text, string unit)
    {
        if (text.StartsWith("ERR ", StringComparison.Ordinal))
        {
            return Expected<double>.Refused(text[4..].Trim());
        }

        var comma = text.IndexOf(',', StringComparison.Ordinal);
        return comma >= 0 && text[(comma + 1)..] == unit ? FiniteNumber(text[..comma]) : Expected<double>.Garbage;
    }

    /// <summary>An SCPI NR3 reading: a number; an overflow to infinity is an overload the driver reports, so a value here.</summary>
    public static Expected<double> Nr3(string text) => Number().IsMatch(text) ? Expected<double>.Of(Parse(text)) : Expected<double>.Garbage;

    /// <summary>An SCPI error-queue entry <c>code,"text"</c>: null for code 0, else the entry.</summary>
    public static Expected<string?> ErrorEntry(string text)
    {
        var match = ErrorEntryLine().Match(text);
        return match.Success && int.TryParse(match.Groups[1].Value, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var code)
            ? Expected<string?>.Of(code == 0 ? null : text)
            : Expected<string?>.Garbage;
    }

    /// <summary>The SMU's <c>READ?</c> reply <c>volts,flag</c>: a finite number, a comma, 0 or 1 (blanks allowed around it).</summary>
    public static Expected<SourceMeterReading> SourceMeterReading(string text)
    {
        var match = SmuLine().Match(text);
        return match.Success && Parse(match.Groups[1].Value) is var volts && double.IsFinite(volts)
            ? Expected<SourceMeterReading>.Of(new SourceMeterReading(volts, match.Groups[2].Value == "1"))
            : Expected<SourceMeterReading>.Garbage;
    }

    /// <summary>A unit-link frame: a message of printable ASCII without <c>*</c>, <c>*</c>, two upper-case hex digits that are its byte sum mod 256.</summary>
    public static Expected<string> Frame(string text)
    {
        var match = FrameLine().Match(text);
        if (!match.Success)
        {
            return Expected<string>.Garbage;
        }

        var body = match.Groups[1].Value;
        var sum = body.Sum(c => (int)c) % 256;
        return sum == Convert.ToInt32(match.Groups[2].Value, 16) ? Expected<string>.Of(body) : Expected<string>.Garbage;
    }

    /// <summary>A unit-link acknowledgement: <c>OK</c>, or <c>ERR text</c>.</summary>
    public static Expected<bool> UnitOk(string text)
        => text.StartsWith("ERR ", StringComparison.Ordinal) ? Expected<bool>.Refused(text[4..])
            : text == "OK" ? Expected<bool>.Of(true) : Expected<bool>.Garbage;

    /// <summary>A unit-link reply <c>KEYWORD rest</c> (or <c>ERR text</c>), the rest judged by <paramref name="rest"/>.</summary>
    public static Expected<T> UnitReply<T>(string text, string keyword, Func<string, Expected<T>> rest)
        => text.StartsWith("ERR ", StringComparison.Ordinal) ? Expected<T>.Refused(text[4..])
            : text.StartsWith(keyword + " ", StringComparison.Ordinal) ? rest(text[(keyword.Length + 1)..]) : Expected<T>.Garbage;

    /// <summary>A unit's identity after <c>ID </c>: three non-empty comma-separated fields.</summary>
    public static Expected<UnitIdentity> UnitIdentity(string rest)
    {
        var fields = rest.Split(',');
        return fields.Length == 3 && fields.All(f => f.Length > 0) ? Expected<UnitIdentity>.Of(new UnitIdentity(fields[0], fields[1], fields[2])) : Expected<UnitIdentity>.Garbage;
    }

    /// <summary>Counts after <c>RAW </c>: a whole number that fits 64 bits, optional sign, nothing else.</summary>
    public static Expected<long> Counts(string rest)
        => WholeNumber().IsMatch(rest) && long.TryParse(rest, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var n) ? Expected<long>.Of(n) : Expected<long>.Garbage;

    /// <summary>The register list after <c>TRIM </c>: empty, or <c>NAME=whole</c> items separated by commas, each name once.</summary>
    public static Expected<IReadOnlyDictionary<string, long>> TrimList(string rest)
    {
        var values = new Dictionary<string, long>(StringComparer.Ordinal);
        if (rest.Length == 0)
        {
            return Expected<IReadOnlyDictionary<string, long>>.Of(values);
        }

        foreach (var item in rest.Split(','))
        {
            var match = Register().Match(item);
            if (!match.Success || Counts(match.Groups[2].Value) is not { Kind: ExpectedKind.Value } value || !values.TryAdd(match.Groups[1].Value, value.Value))
            {
                return Expected<IReadOnlyDictionary<string, long>>.Garbage;
            }
        }

        return Expected<IReadOnlyDictionary<string, long>>.Of(values);
    }

    private static double Parse(string text) => double.Parse(text.Trim(' ', '\t'), NumberStyles.Float, CultureInfo.InvariantCulture);

    [GeneratedRegex("^" + NumberPattern + @"\z", RegexOptions.CultureInvariant)]
    private static partial Regex Number();

    [GeneratedRegex("^(" + NumberPattern + "),(" + NumberPattern + @"),(OK|FAULT .+)\z", RegexOptions.CultureInvariant | RegexOptions.Singleline)]
    private static partial Regex StatusLine();

    [GeneratedRegex(@"^([+-]?[0-9]+),"".*""\z", RegexOptions.CultureInvariant | RegexOptions.Singleline)]
    private static partial Regex ErrorEntryLine();

    [GeneratedRegex("^(" + NumberPattern + @"),[ \t]*([01])[ \t]*\z", RegexOptions.CultureInvariant)]
    private static partial Regex SmuLine();

    [GeneratedRegex(@"^([\t\x20-\x29\x2B-\x7E]*)\*([0-9A-F]{2})\z", RegexOptions.CultureInvariant)]
    private static partial Regex FrameLine();

    [GeneratedRegex(@"^[+-]?[0-9]+\z", RegexOptions.CultureInvariant)]
    private static partial Regex WholeNumber();

    [GeneratedRegex(@"^([A-Z][A-Z0-9_]*)=(.*)\z", RegexOptions.CultureInvariant | RegexOptions.Singleline)]
    private static partial Regex Register();
}
