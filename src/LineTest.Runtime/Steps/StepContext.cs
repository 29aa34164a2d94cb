using LineTest.Core.Sequences;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Logging;
using Microsoft.Extensions.Logging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// What a step executor may use while one batch runs: the batch and its units, the instruments (only through the
/// <see cref="InstrumentGateway"/>), the operator, the observer, and the unit lifecycle the coordinator owns.
/// </summary>
internal sealed class StepContext
{
    private readonly IUnitLifecycle _lifecycle;

    public StepContext(
        BatchState batch, InstrumentGateway instruments, IUnitLifecycle lifecycle, IOperatorChannel operatorChannel, IBatchObserver observer,
        IPartFitting? partFitting, ILogger logger)
    {
        Batch = batch;
        Instruments = instruments;
        _lifecycle = lifecycle;
        Operator = operatorChannel;
        Observer = observer;
        PartFitting = partFitting;
        Logger = logger;
    }

    public BatchState Batch { get; }

    public SequenceDefinition Sequence => Batch.Request.Sequence;

    public InstrumentGateway Instruments { get; }

    public IOperatorChannel Operator { get; }

    public IBatchObserver Observer { get; }

    /// <summary>Where fitted select-on-test parts go (the simulator), or null on a real station.</summary>
    public IPartFitting? PartFitting { get; }

    public ILogger Logger { get; }

    public void Notify(UnitContext unit) => _lifecycle.Notify(Batch, unit);

    public Task FinishAsync(UnitContext unit) => _lifecycle.FinishAsync(Batch, unit);

    /// <summary>Ends one unit in error with <paramref name="reason"/>; the others go on.</summary>
    public async Task FaultUnitAsync(UnitContext unit, string reason)
    {
        RuntimeLog.UnitFault(Logger, unit.Serial, unit.Slot, reason);
        unit.Machine.Fault(reason);
        await FinishAsync(unit).ConfigureAwait(false);
    }

    /// <summary>Runs <paramref name="run"/> for each unit still in progress, in slot order; a unit fault ends that unit only.</summary>
    public async Task ForEachUnitAsync(Func<UnitContext, Task> run)
    {
        foreach (var unit in Batch.Active)
        {
            try
            {
                await run(unit).ConfigureAwait(false);
            }
            catch (UnitFaultException ex)
            {
                await FaultUnitAsync(unit, ex.Message).ConfigureAwait(false);
            }
        }
    }

    /// <summary>
    /// Shows a prompt about one unit that needs the operator's confirmation (e.g. which parts to fit); the unit shows
    /// as awaiting the operator until it is confirmed, then returns to its trim.
    /// </summary>
    public async Task PromptOperatorAsync(UnitContext unit, string text, CancellationToken ct)
    {
        unit.Machine.BeginPrompt();
        Notify(unit);
        await Operator.PromptAsync(text, confirm: true, ct).ConfigureAwait(false);
        unit.Machine.BeginTrim();
        Notify(unit);
    }
}
