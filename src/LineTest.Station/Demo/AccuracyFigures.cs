namespace LineTest.Station.Demo;

/// <summary>
/// Ground-truth accuracy of one sequence with one fit objective on the simulator: the true post-trim error of every
/// passing unit over the sequence's rated range (read from the simulated part, never from the station's prediction),
/// the irreducible floor from the station's own error budget, and the bias at the verify setpoint.
/// </summary>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="Fit">The fit objective (<c>through-points</c>, <c>minimax</c>) or <c>straight-line</c> for a firmware trim without the sensor model.</param>
/// <param name="Units">Passing units the figures are over.</param>
/// <param name="RmsErrorC">RMS of the true error over units and rated-range temperatures, °C.</param>
/// <param name="MaxAbsErrorC">Largest |true error| over units and rated-range temperatures, °C.</param>
/// <param name="FloorRmsC">RMS over units of the budget's floor (reference, noise, resolution, model spread), °C.</param>
/// <param name="VerifyBiasC">Mean true error at the verify setpoint's temperature, °C.</param>
/// <param name="VerifyReadingMeanC">Mean of the station's verify readings of the same units, °C.</param>
/// <param name="VerifyReadingSdC">Their standard deviation, °C.</param>
/// <param name="PredictedVerifyMeanC">Mean of the budget's predicted error at the verify temperature, °C.</param>
/// <param name="PredictedVerifySdC">The spread the budget predicts there: √(mean u² + var of the predictions), °C.</param>
/// <param name="Stages">Where a gain-and-offset trim's error comes from (<see cref="AccuracyDecomposition"/>); empty otherwise.</param>
/// <param name="DecompositionMismatches">Units whose trim the decomposition could not recompute exactly (should be 0).</param>
public sealed record AccuracyFigures(
    string SequenceId,
    string Fit,
    int Units,
    double RmsErrorC,
    double MaxAbsErrorC,
    double FloorRmsC,
    double VerifyBiasC,
    double VerifyReadingMeanC,
    double VerifyReadingSdC,
    double PredictedVerifyMeanC,
    double PredictedVerifySdC,
    IReadOnlyList<AccuracyStage> Stages,
    int DecompositionMismatches)
{
    /// <summary>RMS true error over the floor.</summary>
    public double Ratio => FloorRmsC > 0 ? RmsErrorC / FloorRmsC : double.PositiveInfinity;
}
