using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Source;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>The simulated dry block answering <see cref="SourceCommands"/> on a pseudo-terminal.</summary>
public sealed class SourceTwin : IDisposable
{
    /// <summary>What the twin answers to <c>*IDN?</c> (invented).</summary>
    public static readonly InstrumentIdentity Identity = new("LineTest", "simulated dry block", "SIM-SRC-1", "1.0");

    private readonly SimulatedDryBlock _block;
    private readonly SourceDefinition _source;

    /// <summary>Starts serving <paramref name="block"/> on the port <paramref name="linkPath"/>.</summary>
    public SourceTwin(SimulatedDryBlock block, string linkPath, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(block);
        _block = block;
        _source = block.Source;
        Server = new LineServer("source", linkPath, PlainFraming.Instance, Handle, logger);
    }

    /// <summary>The line server (port name, received commands, unplug and replug).</summary>
    public LineServer Server { get; }

    /// <inheritdoc/>
    public void Dispose() => Server.Dispose();

    private static string Error(string text) => Replies.Error(300, text);

    private TwinReply Handle(string command)
    {
        switch (command)
        {
            case SourceCommands.Identify:
                return TwinReply.Answer(Identity.ToString());
            case SourceCommands.ReadTemperature:
                return SimulatedAnswer.From(() => _block.ReadTemperatureAsync(default), Replies.Number, Error);
            case SourceCommands.ReadStatus:
                return SimulatedAnswer.From(() => _block.ReadStatusAsync(default), s =>
                    $"{Replies.Number(s.SetpointC)},{Replies.Number(s.ActualC)},{(s.Fault is null ? SourceCommands.NoFault : SourceCommands.FaultPrefix + s.Fault)}", Error);
            case SourceCommands.Standby:
                return SimulatedAnswer.From(async () =>
                {
                    await _block.GoToStandbyAsync(default).ConfigureAwait(false);
                    return true;
                }, _ => Replies.Ok, Error);
        }

        if (command.StartsWith(SourceCommands.SetSetpointHeader + " ", StringComparison.Ordinal))
        {
            var argument = command[(SourceCommands.SetSetpointHeader.Length + 1)..];
            if (!double.TryParse(argument, NumberStyles.Float, CultureInfo.InvariantCulture, out var celsius) || !double.IsFinite(celsius))
            {
                return TwinReply.Answer(Replies.Error(102, $"setpoint '{argument}' is not a number"));
            }

            // The source's own limits, as a real controller has them.
            if (celsius < _source.SafeMinC || celsius > _source.SafeMaxC)
            {
                return TwinReply.Answer(Replies.Error(103, string.Create(CultureInfo.InvariantCulture, $"setpoint {celsius} outside {_source.SafeMinC}..{_source.SafeMaxC}")));
            }

            return SimulatedAnswer.From(async () =>
            {
                await _block.SetSetpointAsync(celsius, default).ConfigureAwait(false);
                return true;
            }, _ => Replies.Ok, Error);
        }

        return TwinReply.Answer(Replies.Error(100, $"unknown command '{command}'"));
    }
}
