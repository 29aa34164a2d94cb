using LineTest.Core.Calibration;
using LineTest.Core.Trims;

namespace LineTest.Core.Sequences;

/// <summary>Which trim method the product uses, and its parameters (the object named after the method).</summary>
public sealed record TrimDefinition
{
    /// <summary><c>dac</c>, <c>resistor</c> or <c>firmware</c>.</summary>
    public required string Method { get; init; }

    /// <summary>Parameters of the DAC trim (method <c>dac</c>).</summary>
    public DacTrimSpec? Dac { get; init; }

    /// <summary>Parameters of the select-on-test resistor trim (method <c>resistor</c>).</summary>
    public ResistorTrimSpec? Resistor { get; init; }

    /// <summary>Parameters of the firmware coefficient trim (method <c>firmware</c>).</summary>
    public FirmwareTrimSpec? Firmware { get; init; }

    /// <summary>
    /// What a gain-and-offset trim makes small: <c>through-points</c> (default; no error at the calibration points) or
    /// <c>minimax</c> (the smallest largest error over the rated range). See <see cref="TrimFits"/>.
    /// </summary>
    public string Fit { get; init; } = TrimFits.ThroughPoints;

    /// <summary>
    /// The sensing diode's temperature model and its spread, or null for a straight-line sensor. With it the trim follows
    /// the diode's curvature (firmware coefficients over the rated range, minimax lines) and the error budget over the
    /// rated range includes the model's uncertainty.
    /// </summary>
    public DiodeSensorModel? SensorModel { get; init; }

    /// <summary>
    /// The analog transfer function the trimmed unit must follow (DAC or resistor trim); null for a firmware trim,
    /// whose unit reports °C itself.
    /// </summary>
    public LinearTransfer? AnalogTarget => Method switch
    {
        TrimMethods.Dac => Dac?.Target,
        TrimMethods.Resistor => Resistor?.Target,
        _ => null,
    };
}
