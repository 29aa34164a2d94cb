using System.Text.RegularExpressions;
using LineTest.Core.Trims;

namespace LineTest.Rig.Simulation;

/// <summary>
/// Design values of the simulated analog unit (the invented CTP-40A) and the part-to-part spread of its components.
/// The output follows the model a DAC trim assumes (<see cref="DacTrimSpec"/>):
/// <c>V_out = G(g)·(V_ref − V_f(T) + e_in) + OffsetStep·(o − CodeNominal)</c> with
/// <c>G(g) = G_design·(1 + GainStep·(g − CodeNominal))</c>, clipped to the amplifier's output swing.
/// With nominal codes a typical part gives about 0.50 V at 0 °C and +10 mV/°C: the diode's ≈ −2 mV/°C times the
/// inverting gain of 5, and <c>V_ref = 0.750 V</c> ≈ V_f(0 °C) + 0.5 V / 5.
/// </summary>
/// <remarks>
/// <para>
/// Serial format: <c>{SerialPrefix}-YYWW-NNNNNN</c>, e.g. <c>CTP40A-2612-000123</c>: two-digit year and ISO week of
/// manufacture (01…53) and a six-digit counter within the lot, zero-padded. <see cref="SerialPattern"/> matches it.
/// </para>
/// <para>All numbers are invented demo values for a fictional product.</para>
/// </remarks>
public sealed record SimulatedUnitDesign
{
    /// <summary>The CTP-40A as shipped in the demo.</summary>
    public static SimulatedUnitDesign Ctp40A { get; } = new();

    /// <summary>Product name the unit reports when identified.</summary>
    public string Product { get; init; } = "CTP-40A";

    /// <summary>Firmware version the unit reports when identified.</summary>
    public string Firmware { get; init; } = "1.4.2";

    /// <summary>First part of every serial.</summary>
    public string SerialPrefix { get; init; } = "CTP40A";

    /// <summary>Register name of the gain DAC on the unit link.</summary>
    public string GainRegister { get; init; } = "GAIN";

    /// <summary>Register name of the offset DAC on the unit link.</summary>
    public string OffsetRegister { get; init; } = "OFFSET";

    /// <summary>Lowest DAC code (both DACs, 12 bit).</summary>
    public long CodeMin { get; init; }

    /// <summary>Highest DAC code (both DACs, 12 bit).</summary>
    public long CodeMax { get; init; } = 4095;

    /// <summary>Code both DACs ship with; the zero of their effect.</summary>
    public long CodeNominal { get; init; } = 2048;

    /// <summary>Declared fractional gain change per gain code.</summary>
    public double GainStepPerCode { get; init; } = 0.0001;

    /// <summary>Declared output change per offset code, volts.</summary>
    public double OffsetStepVolts { get; init; } = 0.0005;

    /// <summary>The transfer function the trimmed unit must follow: output at 0 °C, volts.</summary>
    public double TargetOffsetVolts { get; init; } = 0.500;

    /// <summary>The transfer function the trimmed unit must follow: volts per °C.</summary>
    public double TargetSlopeVoltsPerC { get; init; } = 0.010;

    /// <summary>Constant bias current through the sensing diode, amperes.</summary>
    public double BiasCurrentAmps { get; init; } = 10e-6;

    /// <summary>Typical diode forward voltage at 25 °C and the bias current, volts (sets the nominal saturation current).</summary>
    public double ForwardVoltsAt25C { get; init; } = 0.600;

    /// <summary>Typical diode ideality factor n.</summary>
    public double IdealityNominal { get; init; } = 1.05;

    /// <summary>Spread (1σ) of the ideality factor; draws are kept within [<see cref="IdealityMin"/>, <see cref="IdealityMax"/>].</summary>
    public double IdealitySpread { get; init; } = 0.025;

    /// <summary>Lowest ideality factor a part can have.</summary>
    public double IdealityMin { get; init; } = 1.0;

    /// <summary>Highest ideality factor a part can have.</summary>
    public double IdealityMax { get; init; } = 1.1;

    /// <summary>Spread (1σ) of ln(I_s): the saturation current is log-normal between parts.</summary>
    public double SaturationCurrentLogSpread { get; init; } = 0.3;

    /// <summary>Typical diode series resistance, Ω.</summary>
    public double SeriesResistanceOhms { get; init; } = 20;

    /// <summary>Spread (1σ) of the series resistance, as a fraction.</summary>
    public double SeriesResistanceSpread { get; init; } = 0.2;

    /// <summary>Design gain G_design of the inverting amplifier.</summary>
    public double DesignGain { get; init; } = 5.0;

    /// <summary>Spread (1σ) of the actual G_design between parts, as a fraction; draws kept within ±2σ (±3 %).</summary>
    public double DesignGainSpread { get; init; } = 0.015;

    /// <summary>Amplifier reference voltage V_ref, volts.</summary>
    public double ReferenceVolts { get; init; } = 0.750;

    /// <summary>Spread (1σ) of the amplifier's input offset e_in, volts; draws kept within ±2σ (±5 mV).</summary>
    public double InputOffsetSpreadVolts { get; init; } = 0.0025;

    /// <summary>Spread (1σ) of each DAC's actual step from its declared step, as a fraction; draws kept within ±2σ (±0.5 %).</summary>
    public double DacStepSpread { get; init; } = 0.0025;

    /// <summary>Lowest output the amplifier can drive, volts.</summary>
    public double OutputMinVolts { get; init; } = 0.005;

    /// <summary>Highest output the amplifier can drive (near its 3.3 V supply), volts.</summary>
    public double OutputMaxVolts { get; init; } = 3.2;

    /// <summary>Typical supply current, amperes.</summary>
    public double SupplyCurrentAmps { get; init; } = 0.0025;

    /// <summary>Spread (1σ) of the supply current, amperes.</summary>
    public double SupplyCurrentSpreadAmps { get; init; } = 0.00005;

    /// <summary>The serial regular expression for this design (anchored).</summary>
    public string SerialPattern => $"^{Regex.Escape(SerialPrefix)}-[0-9]{{2}}(0[1-9]|[1-4][0-9]|5[0-3])-[0-9]{{6}}$";

    /// <summary>The DAC trim parameters a sequence for this design uses, with the design's target transfer.</summary>
    public DacTrimSpec ToDacTrimSpec() => new()
    {
        Gain = new DacChannelSpec { Min = CodeMin, Max = CodeMax, Nominal = CodeNominal, Step = GainStepPerCode, Register = GainRegister },
        Offset = new DacChannelSpec { Min = CodeMin, Max = CodeMax, Nominal = CodeNominal, Step = OffsetStepVolts, Register = OffsetRegister },
        Target = new LinearTransfer { OffsetVolts = TargetOffsetVolts, SlopeVoltsPerC = TargetSlopeVoltsPerC },
    };

    /// <summary>The target transfer function of a trimmed unit.</summary>
    public LinearTransfer Target => new() { OffsetVolts = TargetOffsetVolts, SlopeVoltsPerC = TargetSlopeVoltsPerC };

    /// <summary>The diode every part's spread is drawn around: n nominal, R_s nominal, V_f(25 °C) nominal.</summary>
    public SiliconDiode NominalDiode()
        => SiliconDiode.WithForwardVolts(ForwardVoltsAt25C, 25.0, BiasCurrentAmps, IdealityNominal, SeriesResistanceOhms);
}
