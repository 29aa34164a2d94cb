using System.CommandLine;
using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Rigs;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;
using LineTest.Station.Composition;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest probe</c>: opens every instrument of a fixture, prints its identity and one reading, or exactly why
/// not. Exit 0 when every instrument is usable, 1 when any is not, 2 for a bad fixture file or arguments.
/// </summary>
public static class ProbeCommand
{
    /// <summary>Builds the command.</summary>
    public static Command Create(CliContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var fixture = new Option<string?>("--fixture") { Description = "Fixture file (default: the station's)" };
        var serial = new Option<bool>("--serial") { Description = "For a simulator fixture: probe the simulated instruments through the serial drivers over pseudo-terminal ports (Linux)" };
        var seed = new Option<int>("--seed") { Description = "Simulator seed for --serial", DefaultValueFactory = _ => 4040 };
        var command = new Command("probe", "Open every instrument of a fixture and show who answers and one reading each")
        {
            fixture, serial, seed,
        };
        command.SetAction(async (parse, ct) =>
        {
            var path = parse.GetValue(fixture) is { } f ? Path.GetFullPath(f) : ContentRoot.Resolve(context.Root, context.Options.Fixture);
            var loaded = DefinitionFiles.LoadFixture(path, context.Error);
            if (!loaded.IsSuccess)
            {
                return ExitCodes.BadInput;
            }

            var fx = loaded.Value!;
            if (fx.Rig == "serial")
            {
                using var rig = SerialRig.Open(fx, context.Loggers);
                return await ProbeAsync(context, fx, rig, "", ct).ConfigureAwait(false);
            }

            if (!parse.GetValue(serial))
            {
                return context.BadInput($"fixture '{fx.Id}' is a simulator fixture with no serial ports; add --serial to probe its simulated instruments through pseudo-terminal ports");
            }

            if (!PseudoTerminalsAvailable(context))
            {
                return ExitCodes.RuntimeFailure;
            }

            var sensor = ReferenceConversion.SensorOf(fx);
            var simulated = new SimulatedRig(fx, parse.GetValue(seed), new VirtualTimeProvider(TimeProvider.System.GetUtcNow()), ReferenceConversion.FromCelsius(sensor));
            var factory = new SimulatedUnitFactory(parse.GetValue(seed), simulated.Simulation, SimulatedUnitDesign.Ctp40A);
            foreach (var slot in fx.Slots)
            {
                // A good unit in every slot, so that each unit link has something to answer.
                simulated.Load(slot.Slot, factory.NextUnit(UnitDefect.None));
            }

            using var twins = new SimulatedSerialRig(simulated, context.Loggers);
            return await ProbeAsync(context, twins.Fixture, twins.Drivers, " (simulated, over pseudo-terminal ports)", ct).ConfigureAwait(false);
        });
        return command;
    }

    private static bool PseudoTerminalsAvailable(CliContext context)
    {
        if (LineTest.Rig.Serial.Pty.PseudoTerminal.IsSupported)
        {
            return true;
        }

        context.Error.WriteLine("linetest: --serial needs Linux pseudo-terminals, which this system does not offer");
        return false;
    }

    private static async Task<int> ProbeAsync(CliContext context, FixtureDefinition fixture, SerialRig rig, string note, CancellationToken ct)
    {
        var output = context.Output;
        var inv = CultureInfo.InvariantCulture;
        output.WriteLine(string.Create(inv, $"Probing fixture {fixture.Id}{note}: {(fixture.SourceMeter is null ? 3 : 4) + fixture.Slots.Count} instruments"));
        var results = await RigProbe.RunAsync(rig, fixture.Slots.Count > 0 ? fixture.Slots[0].OutputChannel : 1, ct).ConfigureAwait(false);
        foreach (var r in results)
        {
            var status = r.Status switch
            {
                ProbeStatus.Usable => "ok",
                ProbeStatus.NoUnit => "no unit",
                _ => "UNUSABLE",
            };
            output.WriteLine(string.Create(inv, $"{r.Instrument,-12} {r.Port,-24} {status,-8} {Describe(r)}"));
        }

        var unusable = results.Count(r => r.Status == ProbeStatus.Unusable);
        var noUnit = results.Count(r => r.Status == ProbeStatus.NoUnit);
        output.WriteLine(string.Create(inv, $"{results.Count} instruments: {results.Count - unusable - noUnit} usable, {unusable} unusable, {noUnit} slots without a unit"));
        return unusable > 0 ? ExitCodes.RuntimeFailure : ExitCodes.Done;
    }

    private static string Describe(ProbeResult r) => r.Status == ProbeStatus.Usable
        ? $"{r.Identity}; {r.Reading}"
        : r.Identity is null ? r.Problem! : $"{r.Identity}; {r.Problem}";
}
