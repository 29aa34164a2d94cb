using LineTest.Runtime.Batches;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Station.Composition;

/// <summary>The optional parts of a coordinator, each with the default a simulated run uses.</summary>
public sealed record CoordinatorParts
{
    /// <summary>Shows prompts; default: confirms every prompt at once (<see cref="AutoConfirmOperator"/>).</summary>
    public IOperatorChannel Operator { get; init; } = new AutoConfirmOperator();

    /// <summary>Live progress (the operator screen), or null.</summary>
    public IBatchObserver? Observer { get; init; }

    /// <summary>The coordinator's logger; default: none.</summary>
    public ILogger Logger { get; init; } = NullLogger.Instance;

    /// <summary>Instrument pacing; default: <see cref="InstrumentTiming"/>'s defaults.</summary>
    public InstrumentTiming? Timing { get; init; }

    /// <summary>Where fitted select-on-test parts go; default for a simulated station: its simulator; null on a real one.</summary>
    public IPartFitting? PartFitting { get; init; }
}
