using System.Text.RegularExpressions;
using LineTest.Core.Trims;

namespace LineTest.Rig.Simulation;

/// <summary>
/// Design values of a simulated unit (the invented CTP-40 family) and the part-to-part spread of its components.
/// The default values are the analog CTP-40A (<see cref="Ctp40A"/>); <see cref="Ctp40R"/> and <see cref="Ctp40D"/> change
/// what differs. The CTP-40A's output follows the model a DAC trim assumes (<see cref="DacTrimSpec"/>):
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

    /// <summary>
    /// The CTP-40R: the same diode and a bipolar pre-amplifier <c>u(T) = A·(V_b − V_f(T) + e_in)</c> with A = 2.5 and
    /// V_b = 0.680 V, then the select-on-test network of <see cref="ResistorTrimSpec"/>:
    /// <c>V(T) = (1 + Rf/Rg)·u(T) + Vref·Rfo/Ro</c>, Rf = 10 kΩ, Rg at R7 (10 kΩ fitted for calibration),
    /// Vref = 2.5 V, Rfo = 10 kΩ, Ro at R8 (71.5 kΩ fitted for calibration). A typical part needs G ≈ 2 and
    /// Voff ≈ 0.35 V; the spread of the diode and pre-amplifier asks for Rg ≈ 8…12 kΩ and Ro ≈ 40…180 kΩ.
    /// Trim parts are 0.1 % thin-film E96 parts.
    /// </summary>
    public static SimulatedUnitDesign Ctp40R { get; } = new()
    {
        Kind = SimulatedUnitKind.ResistorTrimmed,
        Product = "CTP-40R",
        Firmware = "id-1.0",
        SerialPrefix = "CTP40R",
        DesignGain = 2.5,
        ReferenceVolts = 0.680,
    };

    /// <summary>
    /// The CTP-40D: the same diode read by a 20-bit ADC against a 1.25 V reference (±0.2 % 1σ between parts), about
    /// −1670 counts/°C; the firmware reports <c>T = c0 + c1·r + c2·r²</c> from Q-format registers C0, C1, C2 loaded
    /// from non-volatile memory. It has no analog output.
    /// </summary>
    public static SimulatedUnitDesign Ctp40D { get; } = new()
    {
        Kind = SimulatedUnitKind.FirmwareTrimmed,
        Product = "CTP-40D",
        Firmware = "2.0.3",
        SerialPrefix = "CTP40D",
        SupplyCurrentAmps = 0.0032,
    };

    /// <summary>The three demo designs by product name: the one place that maps a sequence's product to a design.</summary>
    public static IReadOnlyList<SimulatedUnitDesign> Demo { get; } = [Ctp40A, Ctp40R, Ctp40D];

    /// <summary>The demo design whose product is <paramref name="product"/>, or null when there is none.</summary>
    public static SimulatedUnitDesign? ForProduct(string product) =>
        Demo.FirstOrDefault(d => string.Equals(d.Product, product, StringComparison.Ordinal));

    /// <summary>How the design is trimmed.</summary>
    public SimulatedUnitKind Kind { get; init; } = SimulatedUnitKind.DacTrimmed;

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

    /// <summary>Typical saturation-current temperature exponent XTI of the diode.</summary>
    public double XtiNominal { get; init; } = SiliconDiode.SaturationCurrentTemperatureExponent;

    /// <summary>Spread (1σ) of XTI between parts; draws kept within ±2σ.</summary>
    public double XtiSpread { get; init; } = 0.1;

    /// <summary>Typical band-gap energy of the diode's saturation-current law, eV.</summary>
    public double BandGapNominalElectronVolts { get; init; } = SiliconDiode.SiliconBandGapElectronVolts;

    /// <summary>Spread (1σ) of that band gap between parts, eV; draws kept within ±2σ.</summary>
    public double BandGapSpreadElectronVolts { get; init; } = 0.005;

    /// <summary>
    /// Spread (1σ) of the quadratic non-linearity β of the stage that reads the diode, 1/V (mean 0; draws kept within
    /// ±2σ): about ±0.015 mV of bow over the CTP-40's rated range at 1σ.
    /// </summary>
    public double NonLinearitySpreadPerVolt { get; init; } = 0.004;

    /// <summary>The diode voltage about which the non-linearity is centred, volts (the typical V_f near +15 °C).</summary>
    public double NonLinearityCentreVolts { get; init; } = 0.62;

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

    /// <summary>Resistor trim: board position of the gain resistor Rg.</summary>
    public string GainPosition { get; init; } = "R7";

    /// <summary>Resistor trim: fixed feedback resistor Rf of the gain stage, Ω.</summary>
    public double GainFeedbackOhms { get; init; } = 10_000;

    /// <summary>Resistor trim: Rg fitted (a precision part) while the unit is calibrated, Ω.</summary>
    public double GainFittedOhms { get; init; } = 10_000;

    /// <summary>Resistor trim: board position of the offset resistor Ro.</summary>
    public string OffsetPosition { get; init; } = "R8";

    /// <summary>Resistor trim: the offset network's reference voltage, volts.</summary>
    public double OffsetNetworkReferenceVolts { get; init; } = 2.5;

    /// <summary>Resistor trim: feedback resistor Rfo of the summing stage, Ω.</summary>
    public double OffsetFeedbackOhms { get; init; } = 10_000;

    /// <summary>Resistor trim: Ro fitted (a precision part) while the unit is calibrated, Ω.</summary>
    public double OffsetFittedOhms { get; init; } = 71_500;

    /// <summary>Resistor trim: ± tolerance of the trim parts the operator fits, percent (each part drawn within it).</summary>
    public double TrimPartTolerancePercent { get; init; } = 0.1;

    /// <summary>Firmware trim: ADC resolution, bits (counts run from 0 to 2^bits − 1).</summary>
    public int AdcBits { get; init; } = 20;

    /// <summary>Firmware trim: nominal ADC reference voltage, volts.</summary>
    public double AdcReferenceVolts { get; init; } = 1.25;

    /// <summary>Firmware trim: spread (1σ) of the ADC reference between parts, as a fraction; draws kept within ±2σ.</summary>
    public double AdcReferenceSpread { get; init; } = 0.002;

    /// <summary>Firmware trim: ADC noise (1σ), counts.</summary>
    public double AdcNoiseCounts { get; init; } = 2.0;

    /// <summary>Firmware trim: the coefficient registers c0, c1, c2 (Q formats: 32-bit C0 Q15.16, C1, C2 ).</summary>
    public IReadOnlyList<FirmwareCoefficientSpec> CoefficientRegisters { get; init; } =
    [
        new() { Register = "C0", Bits = 32, FractionalBits = 16 },
        new() { Register = "C1", Bits = 32, FractionalBits = 40 },
        new() { Register = "C2", Bits = 32, FractionalBits = 60 },
    ];

    /// <summary>Highest raw reading of the ADC (full scale), counts.</summary>
    public long AdcFullScaleCounts => (1L << AdcBits) - 1;

    /// <summary>The serial regular expression for this design (anchored).</summary>
    public string SerialPattern => $"^{Regex.Escape(SerialPrefix)}-[0-9]{{2}}(0[1-9]|[1-4][0-9]|5[0-3])-[0-9]{{6}}$";

    /// <summary>The DAC trim parameters a sequence for this design uses, with the design's target transfer.</summary>
    public DacTrimSpec ToDacTrimSpec() => new()
    {
        Gain = new DacChannelSpec { Min = CodeMin, Max = CodeMax, Nominal = CodeNominal, Step = GainStepPerCode, Register = GainRegister },
        Offset = new DacChannelSpec { Min = CodeMin, Max = CodeMax, Nominal = CodeNominal, Step = OffsetStepVolts, Register = OffsetRegister },
        Target = new LinearTransfer { OffsetVolts = TargetOffsetVolts, SlopeVoltsPerC = TargetSlopeVoltsPerC },
    };

    /// <summary>The resistor trim parameters a sequence for this design uses (E96 parts, pairs allowed).</summary>
    public ResistorTrimSpec ToResistorTrimSpec() => new()
    {
        Series = "E96",
        AllowPairs = true,
        TolerancePercent = TrimPartTolerancePercent,
        Gain = new ResistorGainNetwork
        {
            Position = GainPosition, FeedbackOhms = GainFeedbackOhms, FittedOhms = GainFittedOhms, MinOhms = 2_000, MaxOhms = 100_000,
        },
        Offset = new ResistorOffsetNetwork
        {
            Position = OffsetPosition, ReferenceVolts = OffsetNetworkReferenceVolts, FeedbackOhms = OffsetFeedbackOhms,
            FittedOhms = OffsetFittedOhms, MinOhms = 20_000, MaxOhms = 1_000_000,
        },
        Target = Target,
    };

    /// <summary>The firmware trim parameters of order <paramref name="order"/> (1 or 2) a sequence for this design uses.</summary>
    public FirmwareTrimSpec ToFirmwareTrimSpec(int order = 1) => new()
    {
        Order = order,
        Coefficients = CoefficientRegisters.Take(order + 1).ToArray(),
    };

    /// <summary>
    /// The coefficients a CTP-40D leaves the factory with, as register values: the straight line through the
    /// nominal part's readings at 0 °C and 40 °C, c2 = 0 (about right, never calibrated).
    /// </summary>
    public IReadOnlyDictionary<string, long> FactoryCoefficientRegisters()
    {
        var diode = NominalDiode();
        double Counts(double c) => diode.ForwardVolts(c, BiasCurrentAmps) / AdcReferenceVolts * (1L << AdcBits);
        var r0 = Counts(0);
        var c1 = 40.0 / (Counts(40) - r0);
        var c0 = -c1 * r0;
        double[] coefficients = [c0, c1, 0.0];
        return CoefficientRegisters.Select((r, i) => (r.Register, Value: (long)Math.Round(coefficients[i] / r.Lsb, MidpointRounding.AwayFromZero)))
            .ToDictionary(p => p.Register, p => p.Value, StringComparer.Ordinal);
    }

    /// <summary>The target transfer function of a trimmed unit.</summary>
    public LinearTransfer Target => new() { OffsetVolts = TargetOffsetVolts, SlopeVoltsPerC = TargetSlopeVoltsPerC };

    /// <summary>The diode every part's spread is drawn around: n nominal, R_s nominal, V_f(25 °C) nominal.</summary>
    public SiliconDiode NominalDiode()
        => SiliconDiode.WithForwardVolts(ForwardVoltsAt25C, 25.0, BiasCurrentAmps, IdealityNominal, SeriesResistanceOhms);
}
