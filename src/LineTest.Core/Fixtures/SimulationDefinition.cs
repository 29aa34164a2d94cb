namespace LineTest.Core.Fixtures;

/// <summary>Physical parameters of the built-in simulator that a real fixture does not need.</summary>
public sealed record SimulationDefinition
{
    /// <summary>Time constant with which a unit's sensor follows the block, seconds.</summary>
    public double UnitLagTimeConstantSeconds { get; init; } = 40;

    /// <summary>Spread (1σ) of the unit lag time constant between parts, as a fraction.</summary>
    public double UnitLagSpread { get; init; } = 0.2;

    /// <summary>Standard deviation of the block's temperature noise once settled, °C.</summary>
    public double BlockNoiseC { get; init; } = 0.002;

    /// <summary>Standard deviation of each unit's output noise, volts.</summary>
    public double UnitOutputNoiseVolts { get; init; } = 0.00005;

    /// <summary>Static offset (°C) between each slot and the reference well; index 0 is slot 1.</summary>
    public IReadOnlyList<double> SlotOffsetsC { get; init; } = [];

    /// <summary>Share of units that are defective (open sensor, stuck DAC or silent).</summary>
    public double DefectRate { get; init; } = 0.04;

    /// <summary>
    /// Share of otherwise good units whose sensing diode is faulty (high series resistance, leaky junction or the wrong
    /// part, chosen evenly): rare, so that yields stay believable. Found by an I–V sweep.
    /// </summary>
    public double SensorDefectRate { get; init; } = 0.006;

    /// <summary>
    /// Time constant with which the reference sensor follows its well, seconds (its own response time; 0 for none). It
    /// gives the reference's approach a second, fast time constant that a first-order fit does not have.
    /// </summary>
    public double ReferenceLagTimeConstantSeconds { get; init; }

    /// <summary>
    /// The sensing die's own lag behind the probe body, as a fraction of the unit's lag time constant (0 for none): a
    /// unit's sensor then follows its well through two lags in series, not the single lag the station's follower fit
    /// assumes.
    /// </summary>
    public double UnitTipLagFraction { get; init; }
}
