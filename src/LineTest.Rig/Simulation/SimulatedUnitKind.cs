namespace LineTest.Rig.Simulation;

/// <summary>How a simulated design is trimmed, which decides its output stage and what its link offers.</summary>
public enum SimulatedUnitKind
{
    /// <summary>Analog output, gain and offset DACs written over the link (the CTP-40A).</summary>
    DacTrimmed,

    /// <summary>Analog output, gain and offset set by select-on-test resistors fitted by the operator (the CTP-40R).</summary>
    ResistorTrimmed,

    /// <summary>Digital: an ADC reads the diode and the firmware reports °C from stored coefficients (the CTP-40D).</summary>
    FirmwareTrimmed,
}
