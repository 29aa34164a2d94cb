using System.Globalization;
using LineTest.Core.Fixtures;

namespace LineTest.Rig.Simulation;

/// <summary>
/// A repeatable stream of simulated units: the same seed, simulation parameters and design give the same parts, in
/// the same order, with the same serials. Each part's components are drawn from its own sub-seed, so forcing a
/// defect on a part does not change the parts that follow.
/// </summary>
/// <remarks>Not thread-safe: one producer draws from a factory.</remarks>
public sealed class SimulatedUnitFactory
{
    private const int MaxCounter = 999_999;

    private readonly Random _stream;
    private readonly SimulationDefinition _simulation;
    private readonly SimulatedUnitDesign _design;
    private readonly SiliconDiode _nominalDiode;
    private readonly int _yearWeek;
    private int _nextCounter;

    /// <summary>Creates a factory.</summary>
    /// <param name="seed">Seed of the whole stream.</param>
    /// <param name="simulation">Unit lag and its spread, output noise, defect rate.</param>
    /// <param name="design">The design the parts are built to.</param>
    /// <param name="yearWeek">Year and ISO week of manufacture in the serial, YYWW (e.g. 2612).</param>
    /// <param name="firstCounter">Counter of the first serial (1…999999), so several factories can share a week without clashing.</param>
    public SimulatedUnitFactory(int seed, SimulationDefinition simulation, SimulatedUnitDesign design, int yearWeek = 2612, int firstCounter = 1)
    {
        ArgumentNullException.ThrowIfNull(simulation);
        ArgumentNullException.ThrowIfNull(design);
        var week = yearWeek % 100;
        if (yearWeek is < 0 or > 9999 || week is < 1 or > 53)
        {
            throw new ArgumentOutOfRangeException(nameof(yearWeek), yearWeek, "yearWeek is YYWW with week 01…53, e.g. 2612.");
        }

        ArgumentOutOfRangeException.ThrowIfLessThan(firstCounter, 1);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(firstCounter, MaxCounter);
        if (!double.IsFinite(simulation.DefectRate) || simulation.DefectRate is < 0 or > 1)
        {
            throw new ArgumentOutOfRangeException(nameof(simulation), simulation.DefectRate, "simulation.defectRate must be a share between 0 and 1.");
        }

        if (!double.IsFinite(simulation.SensorDefectRate) || simulation.SensorDefectRate is < 0 or > 1)
        {
            throw new ArgumentOutOfRangeException(nameof(simulation), simulation.SensorDefectRate, "simulation.sensorDefectRate must be a share between 0 and 1.");
        }

        if (!(simulation.UnitLagTimeConstantSeconds > 0) || !double.IsFinite(simulation.UnitLagTimeConstantSeconds))
        {
            throw new ArgumentOutOfRangeException(nameof(simulation), simulation.UnitLagTimeConstantSeconds, "simulation.unitLagTimeConstantSeconds must be a positive number of seconds.");
        }

        if (!double.IsFinite(simulation.UnitLagSpread) || simulation.UnitLagSpread < 0
            || !double.IsFinite(simulation.UnitOutputNoiseVolts) || simulation.UnitOutputNoiseVolts < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(simulation), "simulation.unitLagSpread and simulation.unitOutputNoiseVolts must be zero or positive.");
        }

        _stream = new Random(seed);
        _simulation = simulation;
        _design = design;
        _nominalDiode = design.NominalDiode();
        _yearWeek = yearWeek;
        _nextCounter = firstCounter;
    }

    /// <summary>
    /// The next part; defective with probability <see cref="SimulationDefinition.DefectRate"/>, the kind chosen evenly,
    /// and otherwise with a faulty sensor with probability <see cref="SimulationDefinition.SensorDefectRate"/>.
    /// </summary>
    public SimulatedUnit NextUnit() => Build(DrawDefect(), drawSensorDefect: true);

    private UnitDefect DrawDefect()
    {
        var isDefective = _stream.NextDouble() < _simulation.DefectRate;
        var kind = _stream.Next(3);
        var defect = !isDefective ? UnitDefect.None : kind switch
        {
            0 => UnitDefect.OpenSensor,
            1 => UnitDefect.StuckDac,
            _ => UnitDefect.Silent,
        };
        return defect;
    }

    /// <summary>The next part with the given defect (or none), for tests and demonstrations.</summary>
    public SimulatedUnit NextUnit(UnitDefect defect)
    {
        // Draw the same two numbers as NextUnit so the stream stays aligned whichever method is used.
        _stream.NextDouble();
        _stream.Next(3);
        return Build(defect);
    }

    /// <summary>
    /// The next part, carrying a serial chosen by the caller: the simulated operator scans a label and the
    /// simulator puts a part with that serial in the slot (for <c>linetest run</c> on the simulator).
    /// </summary>
    public SimulatedUnit NextUnit(string serial)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(serial);
        return Build(DrawDefect(), drawSensorDefect: true, serial);
    }

    private SimulatedUnit Build(UnitDefect defect, bool drawSensorDefect = false, string? serialOverride = null)
    {
        if (_nextCounter > MaxCounter)
        {
            throw new InvalidOperationException($"The serial counter of week {_yearWeek:D4} is exhausted after {MaxCounter} units.");
        }

        var serial = serialOverride ?? string.Create(CultureInfo.InvariantCulture, $"{_design.SerialPrefix}-{_yearWeek:D4}-{_nextCounter:D6}");
        _nextCounter++;
        var partSeed = _stream.Next();
        var noiseSeed = _stream.Next();
        var part = new Random(partSeed);
        var d = _design;

        // ±2σ truncation keeps every part inside the design's stated limits (e.g. gain ±3 %, e_in ±5 mV).
        var diode = new SiliconDiode(
            part.NextLogNormal(_nominalDiode.SaturationCurrentAtT0Amps, d.SaturationCurrentLogSpread),
            part.NextTruncatedNormal(d.IdealityNominal, d.IdealitySpread, d.IdealityMin, d.IdealityMax),
            d.SeriesResistanceOhms * part.NextTruncatedNormal(1, d.SeriesResistanceSpread, 1 - (2 * d.SeriesResistanceSpread), 1 + (2 * d.SeriesResistanceSpread)));
        var parameters = new SimulatedUnitParameters(
            Diode: diode,
            DesignGain: d.DesignGain * part.NextTruncatedNormal(1, d.DesignGainSpread, 1 - (2 * d.DesignGainSpread), 1 + (2 * d.DesignGainSpread)),
            InputOffsetVolts: part.NextTruncatedNormal(0, d.InputOffsetSpreadVolts, -2 * d.InputOffsetSpreadVolts, 2 * d.InputOffsetSpreadVolts),
            GainStepPerCode: d.GainStepPerCode * part.NextTruncatedNormal(1, d.DacStepSpread, 1 - (2 * d.DacStepSpread), 1 + (2 * d.DacStepSpread)),
            OffsetStepVolts: d.OffsetStepVolts * part.NextTruncatedNormal(1, d.DacStepSpread, 1 - (2 * d.DacStepSpread), 1 + (2 * d.DacStepSpread)),
            LagTimeConstantSeconds: part.NextLogNormal(_simulation.UnitLagTimeConstantSeconds, _simulation.UnitLagSpread),
            SupplyCurrentAmps: part.NextNormal(d.SupplyCurrentAmps, d.SupplyCurrentSpreadAmps),
            OpenRailVolts: d.OutputMaxVolts - (0.01 * part.NextDouble()),

            // Drawn last so the analog parts of a seed stay what they were before digital designs existed.
            AdcReferenceVolts: d.AdcReferenceVolts * part.NextTruncatedNormal(1, d.AdcReferenceSpread, 1 - (2 * d.AdcReferenceSpread), 1 + (2 * d.AdcReferenceSpread)));

        // Sensor defects are drawn from the part's own stream after everything else, so parts without one are exactly
        // what they were before sensor defects existed, and the units after them are unchanged.
        var sensorDraw = part.NextDouble();
        var sensorKind = part.Next(3);
        if (drawSensorDefect && defect == UnitDefect.None && sensorDraw < _simulation.SensorDefectRate)
        {
            defect = sensorKind switch
            {
                0 => UnitDefect.HighSeriesResistance,
                1 => UnitDefect.LeakyJunction,
                _ => UnitDefect.WrongPart,
            };
        }

        // The diode's temperature law and the read-out's non-linearity are drawn after everything else too, for the same reason.
        var xti = part.NextTruncatedNormal(d.XtiNominal, d.XtiSpread, d.XtiNominal - (2 * d.XtiSpread), d.XtiNominal + (2 * d.XtiSpread));
        var bandGap = part.NextTruncatedNormal(
            d.BandGapNominalElectronVolts, d.BandGapSpreadElectronVolts, d.BandGapNominalElectronVolts - (2 * d.BandGapSpreadElectronVolts), d.BandGapNominalElectronVolts + (2 * d.BandGapSpreadElectronVolts));
        var beta = part.NextTruncatedNormal(0, d.NonLinearitySpreadPerVolt, -2 * d.NonLinearitySpreadPerVolt, 2 * d.NonLinearitySpreadPerVolt);
        var withLaw = DiodeWithLaw(parameters.Diode, xti, bandGap);
        parameters = parameters with
        {
            Diode = SensorWithDefect(withLaw, defect, part),
            NonLinearityPerVolt = beta,
            TipLagTimeConstantSeconds = parameters.LagTimeConstantSeconds * _simulation.UnitTipLagFraction,
        };
        return new SimulatedUnit(serial, d, parameters, defect, _simulation.UnitOutputNoiseVolts, noiseSeed);
    }

    /// <summary>
    /// The diode with its own XTI and band gap, its saturation current at T0 rescaled so that its saturation current (so
    /// its forward voltage) at 25 °C stays what the draw gave: the spread of V_f is the design's, only the curve's shape changes.
    /// </summary>
    private static SiliconDiode DiodeWithLaw(SiliconDiode diode, double xti, double bandGap)
    {
        const double at25Kelvin = 25.0 + SiliconDiode.ZeroCelsiusKelvin;
        var shaped = diode with { Xti = xti, BandGapElectronVolts = bandGap };
        var scale = diode.SaturationCurrentAmps(at25Kelvin) / shaped.SaturationCurrentAmps(at25Kelvin);
        return shaped with { SaturationCurrentAtT0Amps = diode.SaturationCurrentAtT0Amps * scale };
    }

    /// <summary>The part's diode as a sensor defect leaves it (unchanged for other defects).</summary>
    private static SiliconDiode SensorWithDefect(SiliconDiode diode, UnitDefect defect, Random part) => defect switch
    {
        // Invented but typical magnitudes: a cracked bond adds hundreds of ohms; surface leakage of tens of kilohms;
        // a different junction (e.g. a general-purpose rectifier) has a far larger I_s and n near 1.5.
        UnitDefect.HighSeriesResistance => diode with { SeriesResistanceOhms = 300 + (500 * part.NextDouble()) },
        UnitDefect.LeakyJunction => diode with { ShuntOhms = 30e3 + (120e3 * part.NextDouble()) },
        UnitDefect.WrongPart => diode with
        {
            Ideality = 1.4 + (0.3 * part.NextDouble()),
            SaturationCurrentAtT0Amps = diode.SaturationCurrentAtT0Amps * Math.Pow(10, 3 + (2 * part.NextDouble())),
        },
        _ => diode,
    };
}
