using System.Globalization;
using LineTest.Core.Definitions;

namespace LineTest.Core.Fixtures;

/// <summary>Checks that a parsed fixture makes physical sense; finds every problem, each at its JSON path.</summary>
public static class FixtureChecker
{
    /// <summary>Checks <paramref name="fixture"/>.</summary>
    public static ProblemList Check(FixtureDefinition fixture)
    {
        ArgumentNullException.ThrowIfNull(fixture);
        var problems = new ProblemList();
        problems.AddIf(string.IsNullOrWhiteSpace(fixture.Id), "$.id", "the id must not be empty");
        problems.AddIf(fixture.Rig is not ("simulator" or "serial"), "$.rig", $"unknown rig '{fixture.Rig}' (known: simulator, serial)");
        CheckSource(fixture.Source, problems);
        CheckSlots(fixture, problems);
        var meter = fixture.Meter;
        problems.AddIf(!(meter.RangeVolts > 0), "$.meter.rangeVolts", "the meter range must be positive");
        problems.AddIf(meter.AccuracyPercentOfReading < 0, "$.meter.accuracyPercentOfReading", "cannot be negative");
        problems.AddIf(meter.AccuracyOffsetVolts < 0, "$.meter.accuracyOffsetVolts", "cannot be negative");
        problems.AddIf(!(meter.ResolutionVolts > 0), "$.meter.resolutionVolts", "the resolution must be positive");
        problems.AddIf(!(meter.IntegrationPlc > 0), "$.meter.integrationPlc", "the integration time must be positive");
        var reference = fixture.Reference;
        problems.AddIf(reference.CertificateExpandedUncertaintyC < 0, "$.reference.certificateExpandedUncertaintyC", "cannot be negative");
        problems.AddIf(!(reference.CertificateCoverageFactor > 0), "$.reference.certificateCoverageFactor", "must be positive");
        problems.AddIf(!(reference.ReadoutResolution > 0), "$.reference.readoutResolution", "must be positive");
        if (fixture.Rig == "serial")
        {
            problems.AddIf(fixture.Source.Port is null, "$.source", "a serial rig needs the source's port");
            problems.AddIf(reference.Port is null, "$.reference", "a serial rig needs the reference readout's port");
            problems.AddIf(meter.Port is null, "$.meter", "a serial rig needs the meter's port");
        }

        CheckSourceMeter(fixture, problems);
        CheckScanner(fixture.Scanner, problems);
        CheckPorts(fixture, problems);
        if (fixture.Simulation is { } sim)
        {
            problems.AddIf(!(sim.UnitLagTimeConstantSeconds > 0), "$.simulation.unitLagTimeConstantSeconds", "must be positive");
            problems.AddIf(sim.DefectRate is < 0 or > 1, "$.simulation.defectRate", "must be between 0 and 1");
            problems.AddIf(sim.SensorDefectRate is < 0 or > 1, "$.simulation.sensorDefectRate", "must be between 0 and 1");
            problems.AddIf(sim.SlotOffsetsC.Count > fixture.Slots.Count, "$.simulation.slotOffsetsC", "more offsets than slots");
        }

        return problems;
    }

    private static void CheckSource(SourceDefinition source, ProblemList problems)
    {
        problems.AddIf(source.Kind is not ("dry-block" or "bath" or "chamber"), "$.source.kind",
            $"unknown source kind '{source.Kind}' (known: dry-block, bath, chamber)");
        if (source.SafeMinC >= source.SafeMaxC)
        {
            problems.Add("$.source.safeMinC", $"the safe minimum ({F(source.SafeMinC)} °C) must be below the safe maximum ({F(source.SafeMaxC)} °C)");
        }
        else if (source.StandbyC < source.SafeMinC || source.StandbyC > source.SafeMaxC)
        {
            problems.Add("$.source.standbyC", $"standby {F(source.StandbyC)} °C is outside the safe range {F(source.SafeMinC)} … {F(source.SafeMaxC)} °C");
        }

        problems.AddIf(!(source.RampUpCPerMinute > 0), "$.source.rampUpCPerMinute", "the heating rate must be positive");
        problems.AddIf(!(source.RampDownCPerMinute > 0), "$.source.rampDownCPerMinute", "the cooling rate must be positive");
        problems.AddIf(!(source.SettlingTimeConstantSeconds > 0), "$.source.settlingTimeConstantSeconds", "the time constant must be positive");
    }

    private static void CheckSlots(FixtureDefinition fixture, ProblemList problems)
    {
        problems.AddIf(fixture.Slots.Count == 0, "$.slots", "a fixture needs at least one slot");
        var numbers = new HashSet<int>();
        var channels = new Dictionary<int, (int Slot, string Use)>();
        for (var i = 0; i < fixture.Slots.Count; i++)
        {
            var slot = fixture.Slots[i];
            var path = $"$.slots[{i}]";
            problems.AddIf(slot.Slot < 1, $"{path}.slot", "slot numbers start at 1");
            problems.AddIf(!numbers.Add(slot.Slot), $"{path}.slot", $"slot {slot.Slot} is defined twice");
            foreach (var (channel, key, use) in new[] { (slot.OutputChannel, "outputChannel", "output"), (slot.SupplyChannel, "supplyChannel", "supply shunt") })
            {
                if (channels.TryGetValue(channel, out var other))
                {
                    problems.Add($"{path}.{key}", $"meter channel {channel} is already wired to the {other.Use} of slot {other.Slot}");
                }
                else
                {
                    channels[channel] = (slot.Slot, use);
                }
            }

            problems.AddIf(!(slot.SupplyShuntOhms > 0), $"{path}.supplyShuntOhms", "the shunt resistance must be positive");
            problems.AddIf(fixture.Rig == "serial" && slot.UnitPort is null, $"{path}.unitPort", "a serial rig needs each slot's unit port");
        }
    }

    private static void CheckSourceMeter(FixtureDefinition fixture, ProblemList problems)
    {
        var smu = fixture.SourceMeter;
        var channels = new Dictionary<int, int>();
        for (var i = 0; i < fixture.Slots.Count; i++)
        {
            var slot = fixture.Slots[i];
            if (slot.SmuChannel is not { } channel)
            {
                continue;
            }

            var path = $"$.slots[{i}].smuChannel";
            problems.AddIf(smu is null, path, "a slot with an SMU channel needs the fixture's 'sourceMeter' object");
            problems.AddIf(channel < 1, path, "SMU channels start at 1");
            if (!channels.TryAdd(channel, slot.Slot))
            {
                problems.Add(path, $"SMU channel {channel} is already wired to slot {channels[channel]}");
            }
        }

        if (smu is null)
        {
            return;
        }

        problems.AddIf(!(smu.ComplianceVolts > 0) || !double.IsFinite(smu.ComplianceVolts), "$.sourceMeter.complianceVolts", "the compliance must be a positive number of volts");
        problems.AddIf(!(smu.MaxCurrentAmps > 0) || !double.IsFinite(smu.MaxCurrentAmps), "$.sourceMeter.maxCurrentAmps", "the largest current must be a positive number of amperes");
        problems.AddIf(!(smu.NoiseVolts >= 0) || !double.IsFinite(smu.NoiseVolts), "$.sourceMeter.noiseVolts", "the noise must be zero or a positive number of volts");
        problems.AddIf(fixture.Rig == "serial" && smu.Port is null, "$.sourceMeter", "a serial rig needs the source-measure unit's port");
        problems.AddIf(channels.Count == 0, "$.sourceMeter", "no slot is wired to the source-measure unit: give each slot its smuChannel");
    }

    private static void CheckScanner(ScannerDefinition? scanner, ProblemList problems)
    {
        if (scanner is null)
        {
            return;
        }

        switch (scanner.Kind)
        {
            case "serial":
                problems.AddIf(scanner.Port is null, "$.scanner", "a serial scanner needs its port, e.g. \"port\": { \"name\": \"/dev/ttyACM0\", \"baud\": 9600 }");
                break;
            case "keyboard":
                problems.AddIf(scanner.Port is not null, "$.scanner.port", "a keyboard scanner has no port: set kind to 'serial' or remove the port");
                break;
            default:
                problems.Add("$.scanner.kind", $"unknown scanner kind '{scanner.Kind}' (known: keyboard, serial)");
                break;
        }
    }

    // Every port that is given must be usable: a name, a baud rate, a timeout; the drivers would otherwise fail when opened.
    private static void CheckPorts(FixtureDefinition fixture, ProblemList problems)
    {
        CheckPort(fixture.Source.Port, "$.source.port", problems);
        problems.AddIf(fixture.Source.WellUniformityC is { } uniformity && !(uniformity >= 0 && double.IsFinite(uniformity)), "$.source.wellUniformityC",
            "the well uniformity must be zero or a positive number of degC");
        CheckPort(fixture.Reference.Port, "$.reference.port", problems);
        CheckPort(fixture.Meter.Port, "$.meter.port", problems);
        CheckPort(fixture.SourceMeter?.Port, "$.sourceMeter.port", problems);
        CheckPort(fixture.Scanner?.Port, "$.scanner.port", problems);
        for (var i = 0; i < fixture.Slots.Count; i++)
        {
            CheckPort(fixture.Slots[i].UnitPort, $"$.slots[{i}].unitPort", problems);
        }
    }

    private static void CheckPort(PortDefinition? port, string path, ProblemList problems)
    {
        if (port is null)
        {
            return;
        }

        problems.AddIf(string.IsNullOrWhiteSpace(port.Name), $"{path}.name", "the port needs a name, e.g. /dev/ttyUSB0 or COM3");
        problems.AddIf(port.Baud < 1, $"{path}.baud", "the baud rate must be positive");
        problems.AddIf(port.TimeoutMs < 1, $"{path}.timeoutMs", "the timeout must be at least 1 ms");
        problems.AddIf(port.Retries < 0, $"{path}.retries", "the number of retries cannot be negative");
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
