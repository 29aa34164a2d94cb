using System.Globalization;

namespace LineTest.Rig.Serial.Transport;

/// <summary>Reply forms shared by the source and readout protocols: numbers, <c>OK</c>, and <c>ERR code,text</c>.</summary>
public static class Replies
{
    /// <summary>The acknowledgement of a command that was carried out.</summary>
    public const string Ok = "OK";

    /// <summary>The prefix of an error reply.</summary>
    public const string ErrorPrefix = "ERR ";

    /// <summary>A number in its shortest form that reads back to the same double.</summary>
    public static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    /// <summary>An error reply: <c>ERR code,text</c>.</summary>
    public static string Error(int code, string text) => string.Create(CultureInfo.InvariantCulture, $"{ErrorPrefix}{code},{text}");

    /// <summary>Parses a finite number as <see cref="WireNumber.TryParseDecimal"/> reads it (or an error reply).</summary>
    public static ReplyParse<double> ParseNumber(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        if (IsError(reply, out var error))
        {
            return ReplyParse<double>.Error(error);
        }

        return WireNumber.TryParseDecimal(reply, out var value) && double.IsFinite(value)
            ? ReplyParse<double>.Ok(value)
            : ReplyParse<double>.NotUnderstood("not a number");
    }

    /// <summary>Parses <c>OK</c> (or an error reply).</summary>
    public static ReplyParse<bool> ParseOk(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        if (IsError(reply, out var error))
        {
            return ReplyParse<bool>.Error(error);
        }

        return reply == Ok ? ReplyParse<bool>.Ok(true) : ReplyParse<bool>.NotUnderstood("expected OK");
    }

    /// <summary>True when <paramref name="reply"/> is <c>ERR …</c>; <paramref name="error"/> is what follows.</summary>
    public static bool IsError(string reply, out string error)
    {
        ArgumentNullException.ThrowIfNull(reply);
        if (reply.StartsWith(ErrorPrefix, StringComparison.Ordinal))
        {
            error = reply[ErrorPrefix.Length..].Trim();
            return true;
        }

        error = string.Empty;
        return false;
    }

    /// <summary>Parses an error reply where an identity is expected, else the identity.</summary>
    public static ReplyParse<InstrumentIdentity> ParseIdentity(string reply)
        => IsError(reply, out var error) ? ReplyParse<InstrumentIdentity>.Error(error) : InstrumentIdentity.Parse(reply);
}
