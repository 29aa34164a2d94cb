using System.Globalization;
using LineTest.Core.Characterisation;
using LineTest.Core.Decisions;
using LineTest.Core.Results;
using LineTest.Core.Sequences;
using LineTest.Runtime.Batches;
using LineTest.Runtime.Instruments;
using LineTest.Runtime.Judging;

namespace LineTest.Runtime.Steps;

/// <summary>
/// Runs an <see cref="IvSweepStep"/> on one unit: forces each sweep current through the sensor with the source-measure
/// unit, fits the Shockley equation (<see cref="ShockleyFit"/>) at the reference temperature, and records n, log10 I_s,
/// R_s and the largest residual as readings with limits; with an earlier sweep at another setpoint also dV_f/dT and V_f
/// extrapolated to 0 K (<see cref="ForwardVoltageTemperature"/>).
/// </summary>
/// <remarks>
/// Compliance (an open sensor) and a curve that cannot be fitted are sensor faults: a failing reading whose note says
/// what is wrong, so the unit is rejected. A lost source-measure unit is an instrument fault: the batch stops in error.
/// </remarks>
internal sealed class IvSweepExecutor : StepExecutor<IvSweepStep>
{
    // A resistive leak makes V rise in proportion to I at the bottom of the sweep: there the local slope dV/d(ln I)
    // reaches V itself (tens of V_T), far above the n·V_T the junction shows higher up. Twice is a clear margin.
    private const double LeakSlopeRatio = 2.0;

    protected override Task RunAsync(StepContext context, IvSweepStep step, CancellationToken ct) =>
        context.ForEachUnitAsync(async unit =>
        {
            unit.Machine.BeginMeasure();
            context.Notify(unit);
            await SweepUnitAsync(context.Instruments, context.Sequence, step, unit, ct).ConfigureAwait(false);
        });

    private static async Task SweepUnitAsync(InstrumentGateway instruments, SequenceDefinition sequence, IvSweepStep step, UnitContext unit, CancellationToken ct)
    {
        var name = step.DisplayName;
        var fixture = instruments.Fixture;
        if (!instruments.HasSourceMeter)
        {
            throw new BatchFaultException($"fixture '{fixture.Id}' has no source-measure unit for step '{name}'");
        }

        var channel = fixture.Slots.First(s => s.Slot == unit.Slot).SmuChannel
            ?? throw new UnitFaultException($"slot {unit.Slot} has no smuChannel in fixture '{fixture.Id}': it cannot be swept");
        var compliance = step.ComplianceVolts ?? fixture.SourceMeter?.ComplianceVolts ?? 2.5;
        var currents = step.SweepCurrents();

        var before = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
        var (points, complianceAt) = await SweepAsync(instruments, channel, currents, compliance, step.Samples, ct).ConfigureAwait(false);
        var after = await instruments.ReadReferenceAsync(ct).ConfigureAwait(false);
        var celsius = (before + after) / 2;
        var now = instruments.Now;
        unit.Add(UnlimitedReading.Create($"{name}.reference", celsius, "degC") with { Step = name, Setpoint = step.Setpoint, At = now });

        if (complianceAt is { } amps)
        {
            unit.Add(SensorFault(name, step.Setpoint, now,
                $"open sensor in slot {unit.Slot}: the source-measure unit reached its {F(compliance)} V compliance at {F(amps)} A "
                + "(the sensor path is open, or far more resistive than a diode)"));
            return;
        }

        var kelvin = celsius + ThermalVoltage.ZeroCelsiusKelvin;
        var result = ShockleyFit.Fit(points, kelvin);
        if (!result.TryGetValue(out var fit))
        {
            var leak = LeakDiagnosis(points, ThermalVoltage.AtKelvin(kelvin));
            unit.Add(SensorFault(name, step.Setpoint, now,
                $"the sensor's I–V curve is not a diode's ({result.Reason}){(leak is null ? string.Empty : $"; {leak}")}"));
            return;
        }

        AddFitReadings(step, unit, fit, points, now);
        var bias = step.NominalBiasAmps ?? sequence.NominalBiasAmps;
        if (bias is { } nominal)
        {
            unit.Add(UnlimitedReading.Create($"{name}.vf", fit.VoltsAt(nominal), "V") with { Step = name, Setpoint = step.Setpoint, At = now });
            var earlier = unit.Sweeps.LastOrDefault(s => s.Setpoint != step.Setpoint);
            if (earlier is not null)
            {
                AddTemperatureReadings(step, unit, earlier, fit, celsius, nominal, now);
            }
        }

        unit.Sweeps.Add(new IvSweepRecord(name, step.Setpoint, celsius, fit));
    }

    private static async Task<(List<IvPoint> Points, double? ComplianceAt)> SweepAsync(
        InstrumentGateway instruments, int channel, IReadOnlyList<double> currents, double compliance, int samples, CancellationToken ct)
    {
        var points = new List<IvPoint>(currents.Count);
        double? complianceAt = null;
        foreach (var amps in currents)
        {
            await instruments.SourceMeterAsync((smu, token) => smu.SetCurrentAsync(channel, amps, compliance, token), ct).ConfigureAwait(false);
            var sum = 0.0;
            for (var s = 0; s < samples && complianceAt is null; s++)
            {
                await instruments.DelayAsync(instruments.Timing.MeterReadSeconds, ct).ConfigureAwait(false);
                var reading = await instruments.SourceMeterAsync((smu, token) => smu.MeasureVoltsAsync(token), ct).ConfigureAwait(false);
                if (reading.InCompliance || !double.IsFinite(reading.Volts))
                {
                    complianceAt = amps;
                }

                sum += reading.Volts;
            }

            if (complianceAt is not null)
            {
                break;
            }

            points.Add(new IvPoint(amps, sum / samples));
        }

        await instruments.SourceMeterAsync((smu, token) => smu.OutputOffAsync(token), ct).ConfigureAwait(false);
        return (points, complianceAt);
    }

    private static void AddFitReadings(IvSweepStep step, UnitContext unit, ShockleyFitResult fit, List<IvPoint> points, DateTimeOffset now)
    {
        var name = step.DisplayName;
        var leak = LeakDiagnosis(points, fit.ThermalVolts);
        const string wrongPart = "the junction is not the specified diode (wrong part?)";
        Add(unit, step, now, $"{name}.n", fit.Ideality, "1", step.IdealityLimits, fit.IdealityStandardError, leak ?? wrongPart);
        Add(unit, step, now, $"{name}.log10Is", fit.Log10SaturationCurrent, "1", step.Log10SaturationCurrentLimits,
            fit.Log10SaturationCurrentStandardError, leak ?? wrongPart);
        Add(unit, step, now, $"{name}.rs", fit.SeriesResistanceOhms, "ohm", step.SeriesResistanceLimits, fit.SeriesResistanceStandardErrorOhms,
            fit.SeriesResistanceOhms > 0 ? "a bad bond or contact in the sensor path (series resistance too high)" : leak ?? wrongPart);
        Add(unit, step, now, $"{name}.maxResidual", fit.MaxAbsResidualVolts, "V", step.MaxResidualLimits, null,
            leak ?? "the curve does not follow the Shockley equation (intermittent contact or a damaged junction)", defaultUnit: "mV");
    }

    private static void AddTemperatureReadings(
        IvSweepStep step, UnitContext unit, IvSweepRecord earlier, ShockleyFitResult fit, double celsius, double bias, DateTimeOffset now)
    {
        var name = step.DisplayName;
        var result = ForwardVoltageTemperature.Compute(earlier.Fit, earlier.Celsius, fit, celsius, bias);
        if (!result.TryGetValue(out var tc))
        {
            if (step.TemperatureCoefficientLimits is not null || step.ZeroKelvinLimits is not null)
            {
                unit.Add(SensorFault(name, step.Setpoint, now, $"no temperature coefficient against '{earlier.Step}': {result.Reason}") with
                { Name = $"{name}.tempco" });
            }

            return;
        }

        Add(unit, step, now, $"{name}.tempco", tc.SlopeVoltsPerC, "V/degC", step.TemperatureCoefficientLimits, null,
            $"the forward voltage changes by the wrong amount with temperature (between '{earlier.Setpoint}' and '{step.Setpoint}'): not the specified diode",
            defaultUnit: "mV/degC");
        Add(unit, step, now, $"{name}.vf0K", tc.ZeroKelvinVolts, "V", step.ZeroKelvinLimits, null,
            "the forward voltage does not extrapolate to the silicon band gap at 0 K: not a silicon junction of the specified kind");
    }

    /// <summary>
    /// Records a value in base units (V, ohm, V/degC, 1): with limits, converted to the limits' unit and decided; without,
    /// as an unlimited reading in <paramref name="defaultUnit"/> (or the base unit). A failing reading's note says why.
    /// </summary>
    private static void Add(
        UnitContext unit, IvSweepStep step, DateTimeOffset now, string readingName, double baseValue, string baseUnit, LimitSpec? limits,
        double? standardError, string why, string? defaultUnit = null)
    {
        Reading reading;
        if (limits is not null)
        {
            // The checker allows only units of the reading's own dimension, so scaling from the base unit is enough.
            var scale = UnitsOfMeasure.IsKnown(limits.Unit) ? UnitsOfMeasure.FromBase(1, limits.Unit) : 1.0;
            var uncertainty = standardError is { } se && double.IsFinite(se) ? new ExpandedUncertainty(se * scale, 2) : null;
            reading = ReadingFactory.Create(readingName, baseValue * scale, limits, uncertainty, at: now);
            if (reading.Verdict != Verdict.Pass)
            {
                reading = reading with { Note = $"{ReadingText.Describe(reading)}: {why}" };
            }
        }
        else
        {
            var unitSymbol = defaultUnit ?? baseUnit;
            var scale = UnitsOfMeasure.IsKnown(unitSymbol) ? UnitsOfMeasure.FromBase(1, unitSymbol) : 1.0;
            var uncertainty = standardError is { } se && double.IsFinite(se) ? new ExpandedUncertainty(se * scale, 2) : null;
            reading = UnlimitedReading.Create(readingName, baseValue * scale, unitSymbol, uncertainty) with { At = now };
        }

        unit.Add(reading with { Step = step.DisplayName, Setpoint = step.Setpoint });
    }

    /// <summary>
    /// "a leaky junction…" when the lowest pair of points rises with ln I more than twice as steeply as the flattest pair
    /// of the sweep (a resistive path in parallel dominates at the bottom, the junction above it; a wrong part is steep
    /// everywhere, a high R_s only at the top); null otherwise.
    /// </summary>
    private static string? LeakDiagnosis(IReadOnlyList<IvPoint> points, double thermalVolts)
    {
        if (points.Count < 3)
        {
            return null;
        }

        double Local(int i) => (points[i + 1].Volts - points[i].Volts) / (thermalVolts * Math.Log(points[i + 1].CurrentAmps / points[i].CurrentAmps));
        var bottom = Local(0);
        var flattest = Enumerable.Range(0, points.Count - 1).Min(Local);
        return bottom > LeakSlopeRatio * Math.Max(flattest, 1.0)
            ? $"a leaky junction: at the lowest currents the voltage rises like a resistor's (local n = {bottom.ToString("0.#", CultureInfo.InvariantCulture)}, "
              + $"{flattest.ToString("0.##", CultureInfo.InvariantCulture)} higher up), as a leakage path across the junction makes it"
            : null;
    }

    private static Reading SensorFault(string name, string setpoint, DateTimeOffset now, string note) =>
        new($"{name}.fit", null, "1", null, null, Verdict.Fail) { Step = name, Setpoint = setpoint, At = now, Note = note };

    private static string F(double value) => value.ToString("G4", CultureInfo.InvariantCulture);
}
