using System.Globalization;
using System.Text;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.UnitLink;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>
/// The unit in one simulated slot answering <see cref="UnitLinkCommands"/> on a pseudo-terminal. An empty slot or a
/// silent unit does not answer; a unit with a garbled link answers frames whose checksum is wrong.
/// </summary>
public sealed class UnitLinkTwin : IDisposable
{
    private static readonly TwinReply CorruptedFrame = Corrupted("RAW 0");

    private readonly SimulatedUnitLink _link;

    /// <summary>Starts serving <paramref name="link"/> on the port <paramref name="linkPath"/>.</summary>
    public UnitLinkTwin(SimulatedUnitLink link, string linkPath, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(link);
        _link = link;
        Server = new LineServer($"unit slot {link.Slot}", linkPath, ChecksumFraming.Instance, Handle, logger);
    }

    /// <summary>The line server.</summary>
    public LineServer Server { get; }

    /// <inheritdoc/>
    public void Dispose() => Server.Dispose();

    // A unit-link message may not contain the frame's '*'.
    private static string Error(string text) => UnitLinkCommands.ErrorPrefix + text.Replace('*', 'x');

    private static TwinReply Corrupted(string body)
    {
        var wrong = (byte)(ChecksumFraming.Checksum(body) ^ 0x5A);
        return TwinReply.Raw(Encoding.ASCII.GetBytes(string.Create(CultureInfo.InvariantCulture, $"{body}*{wrong:X2}\n")));
    }

    private static string Registers(IReadOnlyDictionary<string, long> values)
        => string.Join(',', values.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => string.Create(CultureInfo.InvariantCulture, $"{p.Key}={p.Value}")));

    private TwinReply Handle(string command)
    {
        switch (command)
        {
            case UnitLinkCommands.Identify:
                return SimulatedAnswer.From(() => _link.IdentifyAsync(default), id => $"ID {id.Serial},{id.Product},{id.Firmware}", Error, CorruptedFrame);
            case UnitLinkCommands.ReadRaw:
                return SimulatedAnswer.From(() => _link.ReadRawAsync(default), raw => string.Create(CultureInfo.InvariantCulture, $"RAW {raw}"), Error, CorruptedFrame);
            case UnitLinkCommands.ReadTemperature:
                return SimulatedAnswer.From(() => _link.ReadTemperatureAsync(default), c => $"TEMP {Replies.Number(c)}", Error, CorruptedFrame);
            case UnitLinkCommands.Store:
                return SimulatedAnswer.From(async () =>
                {
                    await _link.StoreAsync(default).ConfigureAwait(false);
                    return true;
                }, _ => UnitLinkCommands.Ok, Error, CorruptedFrame);
            case UnitLinkCommands.ReadBack:
                return SimulatedAnswer.From(() => _link.ReadBackAsync(default), values => $"{UnitLinkCommands.Trim} {Registers(values)}", Error, CorruptedFrame);
        }

        if (command.StartsWith(UnitLinkCommands.Trim + " ", StringComparison.Ordinal))
        {
            var values = UnitLinkCommands.ParseTrimList(command[(UnitLinkCommands.Trim.Length + 1)..]);
            if (values is null || values.Count == 0)
            {
                return TwinReply.Answer(Error($"malformed trim list '{command}'"));
            }

            return SimulatedAnswer.From(async () =>
            {
                await _link.WriteTrimAsync(values, default).ConfigureAwait(false);
                return true;
            }, _ => UnitLinkCommands.Ok, Error, CorruptedFrame);
        }

        return TwinReply.Answer(Error($"unknown command '{command}'"));
    }
}
