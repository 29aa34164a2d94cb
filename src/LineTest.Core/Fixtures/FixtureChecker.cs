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
        DefinitionBounds.MeterRangeVolts.Check(meter.RangeVolts, "$.meter.rangeVolts", problems);
        DefinitionBounds.AccuracyPercent.Check(meter.AccuracyPercentOfReading, "$.meter.accuracyPercentOfReading", problems);
        DefinitionBounds.MeterVolts.Check(meter.AccuracyOffsetVolts, "$.meter.accuracyOffsetVolts", problems);
        DefinitionBounds.ResolutionVolts.Check(meter.ResolutionVolts, "$.meter.resolutionVolts", problems);
        DefinitionBounds.IntegrationPlc.Check(meter.IntegrationPlc, "$.meter.integrationPlc", problems);
        var reference = fixture.Reference;
        DefinitionBounds.CertificateUncertaintyC.Check(reference.CertificateExpandedUncertaintyC, "$.reference.certificateExpandedUncertaintyC", problems);
        DefinitionBounds.CoverageFactor.Check(reference.CertificateCoverageFactor, "$.reference.certificateCoverageFactor", problems);
        DefinitionBounds.ReadoutResolution.Check(reference.ReadoutResolution, "$.reference.readoutResolution", problems);
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
            CheckSimulation(sim, fixture.Slots.Count, problems);
        }

        return problems;
    }

    // Every number the simulator takes from the fixture: the simulator relies on these bounds and checks nothing itself.
    private static void CheckSimulation(SimulationDefinition sim, int slots, ProblemList problems)
    {
        DefinitionBounds.TimeConstantSeconds.Check(sim.UnitLagTimeConstantSeconds, "$.simulation.unitLagTimeConstantSeconds", problems);
        DefinitionBounds.LagSpread.Check(sim.UnitLagSpread, "$.simulation.unitLagSpread", problems);
        DefinitionBounds.BlockNoiseC.Check(sim.BlockNoiseC, "$.simulation.blockNoiseC", problems);
        DefinitionBounds.NoiseVolts.Check(sim.UnitOutputNoiseVolts, "$.simulation.unitOutputNoiseVolts", problems);
        DefinitionBounds.Share.Check(sim.DefectRate, "$.simulation.defectRate", problems);
        DefinitionBounds.Share.Check(sim.SensorDefectRate, "$.simulation.sensorDefectRate", problems);
        DefinitionBounds.SensorLagSeconds.Check(sim.ReferenceLagTimeConstantSeconds, "$.simulation.referenceLagTimeConstantSeconds", problems);
        DefinitionBounds.Share.Check(sim.UnitTipLagFraction, "$.simulation.unitTipLagFraction", problems);
        problems.AddIf(sim.SlotOffsetsC.Count > slots, "$.simulation.slotOffsetsC", $"more offsets ({sim.SlotOffsetsC.Count}) than slots ({slots})");
        for (var i = 0; i < sim.SlotOffsetsC.Count; i++)
        {
            DefinitionBounds.SlotOffsetC.Check(sim.SlotOffsetsC[i], $"$.simulation.slotOffsetsC[{i}]", problems);
        }
    }

    private static void CheckSource(SourceDefinition source, ProblemList problems)
    {
        problems.AddIf(source.Kind is not ("dry-block" or "bath" or "chamber"), "$.source.kind",
            $"unknown source kind '{source.Kind}' (known: dry-block, bath, chamber)");
        // The range is judged once each end is a usable temperature.
        var minOk = DefinitionBounds.TemperatureC.Check(source.SafeMinC, "$.source.safeMinC", problems);
        var maxOk = DefinitionBounds.TemperatureC.Check(source.SafeMaxC, "$.source.safeMaxC", problems);
        var standbyOk = DefinitionBounds.TemperatureC.Check(source.StandbyC, "$.source.standbyC", problems);
        if (minOk && maxOk && source.SafeMinC >= source.SafeMaxC)
        {
            problems.Add("$.source.safeMinC", $"the safe minimum ({F(source.SafeMinC)} °C) must be below the safe maximum ({F(source.SafeMaxC)} °C)");
        }
        else if (minOk && maxOk && standbyOk && (source.StandbyC < source.SafeMinC || source.StandbyC > source.SafeMaxC))
        {
            problems.Add("$.source.standbyC", $"standby {F(source.StandbyC)} °C is outside the safe range {F(source.SafeMinC)} … {F(source.SafeMaxC)} °C");
        }

        DefinitionBounds.RampCPerMinute.Check(source.RampUpCPerMinute, "$.source.rampUpCPerMinute", problems);
        DefinitionBounds.RampCPerMinute.Check(source.RampDownCPerMinute, "$.source.rampDownCPerMinute", problems);
        DefinitionBounds.TimeConstantSeconds.Check(source.SettlingTimeConstantSeconds, "$.source.settlingTimeConstantSeconds", problems);
    }

    private static void CheckSlots(FixtureDefinition fixture, ProblemList problems)
    {
        if (!DefinitionBounds.SlotCount.Admits(fixture.Slots.Count))
        {
            problems.Add("$.slots", $"a fixture needs {DefinitionBounds.SlotCount.Describe()} slots, not {fixture.Slots.Count}");
            if (fixture.Slots.Count == 0)
            {
                return;
            }
        }

        var numbers = new HashSet<int>();
        var channels = new Dictionary<int, (int Slot, string Use)>();
        for (var i = 0; i < fixture.Slots.Count; i++)
        {
            var slot = fixture.Slots[i];
            var path = $"$.slots[{i}]";
            if (DefinitionBounds.SlotNumber.Check(slot.Slot, $"{path}.slot", problems) && !numbers.Add(slot.Slot))
            {
                problems.Add($"{path}.slot", $"slot {slot.Slot} is defined twice");
            }

            DefinitionBounds.Channel.Check(slot.OutputChannel, $"{path}.outputChannel", problems);
            DefinitionBounds.Channel.Check(slot.SupplyChannel, $"{path}.supplyChannel", problems);
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

            DefinitionBounds.Ohms.Check(slot.SupplyShuntOhms, $"{path}.supplyShuntOhms", problems);
            if (slot.WellOffsetC is { } wellOffset)
            {
                DefinitionBounds.SlotOffsetC.Check(wellOffset, $"{path}.wellOffsetC", problems);
            }

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
            if (!DefinitionBounds.Channel.Check(channel, path, problems))
            {
                continue;
            }

            if (!channels.TryAdd(channel, slot.Slot))
            {
                problems.Add(path, $"SMU channel {channel} is already wired to slot {channels[channel]}");
            }
        }

        if (smu is null)
        {
            return;
        }

        DefinitionBounds.ComplianceVolts.Check(smu.ComplianceVolts, "$.sourceMeter.complianceVolts", problems);
        DefinitionBounds.SensorCurrentAmps.Check(smu.MaxCurrentAmps, "$.sourceMeter.maxCurrentAmps", problems);
        DefinitionBounds.NoiseVolts.Check(smu.NoiseVolts, "$.sourceMeter.noiseVolts", problems);
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

        if (string.IsNullOrWhiteSpace(port.Name))
        {
            problems.Add($"{path}.name", "the port needs a name, e.g. /dev/ttyUSB0 or COM3");
        }
        else
        {
            DefinitionBounds.PortName.Check(port.Name, $"{path}.name", problems);
        }

        DefinitionBounds.Baud.Check(port.Baud, $"{path}.baud", problems);
        DefinitionBounds.PortTimeoutMs.Check(port.TimeoutMs, $"{path}.timeoutMs", problems);
        DefinitionBounds.Retries.Check(port.Retries, $"{path}.retries", problems);
    }

    private static string F(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
