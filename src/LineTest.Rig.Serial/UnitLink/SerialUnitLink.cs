using System.Globalization;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.UnitLink;

/// <summary>
/// A unit's own serial link, speaking <see cref="UnitLinkCommands"/> in checksummed frames. Reads are retried after
/// silence or a corrupted frame; a trim write and a store are sent once, never repeated, so a unit is never written
/// twice without the caller knowing.
/// </summary>
public sealed class SerialUnitLink : IUnitLink
{
    /// <summary>Creates the driver on a line that uses <see cref="ChecksumFraming"/>.</summary>
    public SerialUnitLink(SerialLine line)
    {
        ArgumentNullException.ThrowIfNull(line);
        Line = line;
    }

    /// <summary>The unit's serial line.</summary>
    public SerialLine Line { get; }

    /// <inheritdoc/>
    public Task<UnitIdentity> IdentifyAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(UnitLinkCommands.Identify, ParseIdentity, cancellationToken);

    /// <inheritdoc/>
    public Task<long> ReadRawAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(UnitLinkCommands.ReadRaw, ParseRaw, cancellationToken);

    /// <inheritdoc/>
    public Task<double> ReadTemperatureAsync(CancellationToken cancellationToken)
        => Line.QueryAsync(UnitLinkCommands.ReadTemperature, ParseTemperature, cancellationToken);

    /// <inheritdoc/>
    public async Task WriteTrimAsync(IReadOnlyDictionary<string, long> values, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (values.Count == 0)
        {
            throw new ArgumentException("A trim write needs at least one register.", nameof(values));
        }

        _ = await Line.CommandAsync(UnitLinkCommands.TrimList(values), ParseOk, cancellationToken).ConfigureAwait(false);
    }

    /// <inheritdoc/>
    public async Task StoreAsync(CancellationToken cancellationToken)
        => _ = await Line.CommandAsync(UnitLinkCommands.Store, ParseOk, cancellationToken).ConfigureAwait(false);

    /// <inheritdoc/>
    public async Task<IReadOnlyDictionary<string, long>> ReadBackAsync(CancellationToken cancellationToken)
        => await Line.QueryAsync(UnitLinkCommands.ReadBack, ParseTrim, cancellationToken).ConfigureAwait(false);

    /// <summary>Parses an <c>ID serial,product,firmware</c> reply (or <c>ERR text</c>).</summary>
    public static ReplyParse<UnitIdentity> ParseIdentity(string reply) => Keyword(reply, "ID", rest =>
    {
        var fields = rest.Split(',');
        return fields.Length == 3 && fields.All(f => f.Length > 0)
            ? ReplyParse<UnitIdentity>.Ok(new UnitIdentity(fields[0], fields[1], fields[2]))
            : ReplyParse<UnitIdentity>.NotUnderstood("an identity is serial,product,firmware");
    });

    /// <summary>Parses a <c>RAW counts</c> reply (or <c>ERR text</c>).</summary>
    public static ReplyParse<long> ParseRaw(string reply) => Keyword(reply, "RAW", rest =>
        WireNumber.TryParseWhole(rest, out var counts)
            ? ReplyParse<long>.Ok(counts)
            : ReplyParse<long>.NotUnderstood("counts must be a whole number"));

    /// <summary>Parses a <c>TEMP celsius</c> reply (or <c>ERR text</c>); the temperature must be a finite number.</summary>
    public static ReplyParse<double> ParseTemperature(string reply) => Keyword(reply, "TEMP", rest =>
        WireNumber.TryParseDecimal(rest, out var celsius) && double.IsFinite(celsius)
            ? ReplyParse<double>.Ok(celsius)
            : ReplyParse<double>.NotUnderstood("the temperature must be a number"));

    /// <summary>Parses a <c>TRIM NAME=value,…</c> read-back reply (or <c>ERR text</c>).</summary>
    public static ReplyParse<IReadOnlyDictionary<string, long>> ParseTrim(string reply) => Keyword(reply, UnitLinkCommands.Trim, rest =>
        UnitLinkCommands.ParseTrimList(rest) is { } values
            ? ReplyParse<IReadOnlyDictionary<string, long>>.Ok(values)
            : ReplyParse<IReadOnlyDictionary<string, long>>.NotUnderstood("registers are NAME=value,…"));

    /// <summary>Parses the acknowledgement of a write or store: <c>OK</c> (or <c>ERR text</c>).</summary>
    public static ReplyParse<bool> ParseOk(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        return reply == UnitLinkCommands.Ok ? ReplyParse<bool>.Ok(true)
            : reply.StartsWith(UnitLinkCommands.ErrorPrefix, StringComparison.Ordinal) ? ReplyParse<bool>.Error(reply[UnitLinkCommands.ErrorPrefix.Length..])
            : ReplyParse<bool>.NotUnderstood("expected OK");
    }

    private static ReplyParse<T> Keyword<T>(string reply, string keyword, Func<string, ReplyParse<T>> parse)
    {
        ArgumentNullException.ThrowIfNull(reply);
        if (reply.StartsWith(UnitLinkCommands.ErrorPrefix, StringComparison.Ordinal))
        {
            return ReplyParse<T>.Error(reply[UnitLinkCommands.ErrorPrefix.Length..]);
        }

        return reply.StartsWith(keyword + " ", StringComparison.Ordinal)
            ? parse(reply[(keyword.Length + 1)..])
            : ReplyParse<T>.NotUnderstood($"expected a reply starting '{keyword} '");
    }
}
