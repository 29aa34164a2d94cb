using LineTest.Core.Trims;

namespace LineTest.Runtime.Batches;

/// <summary>
/// Where select-on-test parts go once the operator has confirmed fitting them. The coordinator tells the operator
/// which parts to fit (<see cref="IOperatorChannel.PromptAsync"/>, one prompt per unit), waits for the confirmation,
/// and then reports the parts here.
/// </summary>
/// <remarks>
/// A real station needs no implementation: the parts are soldered by the operator, and the run records the chosen
/// values and the confirmation. The simulator implements it (<see cref="SimulatedPartFitting"/>) by fitting parts,
/// drawn within their tolerance, into the simulated unit, so the verify step measures what the operator would have
/// built. Resistor-trimmed units have no trim registers, so nothing goes over the unit link.
/// </remarks>
public interface IPartFitting
{
    /// <summary>The operator confirmed fitting <paramref name="parts"/> to the unit <paramref name="serial"/> in <paramref name="slot"/>.</summary>
    Task PartsFittedAsync(int slot, string serial, IReadOnlyList<ResistorChoice> parts, CancellationToken cancellationToken);
}
