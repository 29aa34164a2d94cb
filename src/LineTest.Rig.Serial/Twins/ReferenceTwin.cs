using LineTest.Rig.Serial.Reference;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Simulation;
using Microsoft.Extensions.Logging;

namespace LineTest.Rig.Serial.Twins;

/// <summary>The simulated reference readout answering <see cref="ReferenceCommands"/> on a pseudo-terminal.</summary>
public sealed class ReferenceTwin : IDisposable
{
    /// <summary>What the twin answers to <c>*IDN?</c> (invented).</summary>
    public static readonly InstrumentIdentity Identity = new("LineTest", "simulated reference readout", "SIM-REF-1", "1.0");

    private readonly SimulatedReferenceReadout _readout;
    private readonly string _unit;

    /// <summary>Starts serving <paramref name="readout"/> on the port <paramref name="linkPath"/>, reporting in <paramref name="unit"/>.</summary>
    public ReferenceTwin(SimulatedReferenceReadout readout, string unit, string linkPath, ILogger logger)
    {
        ArgumentNullException.ThrowIfNull(readout);
        ArgumentException.ThrowIfNullOrWhiteSpace(unit);
        _readout = readout;
        _unit = unit;
        Server = new LineServer("reference", linkPath, PlainFraming.Instance, Handle, logger);
    }

    /// <summary>The line server.</summary>
    public LineServer Server { get; }

    /// <inheritdoc/>
    public void Dispose() => Server.Dispose();

    private TwinReply Handle(string command) => command switch
    {
        ReferenceCommands.Identify => TwinReply.Answer(Identity.ToString()),
        ReferenceCommands.Measure => SimulatedAnswer.From(() => _readout.ReadRawAsync(default), raw => $"{Replies.Number(raw)},{_unit}", text => Replies.Error(200, text)),
        _ => TwinReply.Answer(Replies.Error(100, $"unknown command '{command}'")),
    };
}
