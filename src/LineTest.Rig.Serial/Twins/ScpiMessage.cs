namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// How the SCPI twins answer one message: commands separated by <c>;</c> (a leading <c>:</c> returns to the root),
/// each split into an upper-case header and its argument; the queries' answers joined by <c>;</c>. Silence, junk or
/// a lost port from any command ends the message, as on a real instrument.
/// </summary>
internal static class ScpiMessage
{
    /// <summary>Answers <paramref name="message"/>; <paramref name="execute"/> returns null for a setting with no reply.</summary>
    public static TwinReply Answer(string message, Func<string, string, TwinReply?> execute)
    {
        var replies = new List<string>();
        foreach (var part in message.Split(';'))
        {
            var command = part.Trim().TrimStart(':');
            var space = command.IndexOf(' ', StringComparison.Ordinal);
            var header = (space < 0 ? command : command[..space]).ToUpperInvariant();
            var argument = space < 0 ? string.Empty : command[(space + 1)..].Trim();
            var reply = execute(header, argument);
            if (reply is null)
            {
                continue;
            }

            if (reply.Line is null)
            {
                return reply;
            }

            replies.Add(reply.Line);
        }

        return replies.Count == 0 ? TwinReply.Silence : TwinReply.Answer(string.Join(';', replies));
    }
}
