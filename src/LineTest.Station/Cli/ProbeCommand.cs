using System.CommandLine;
using System.Globalization;
using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Rigs;
using LineTest.Rig.Serial.Scanner;
using LineTest.Rig.Serial.Twins;
using LineTest.Rig.Simulation;
using LineTest.Station.Composition;
using Microsoft.Extensions.Logging;

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
        var scanWait = new Option<double?>("--scan-wait")
        {
            Description = "Seconds to listen for a code from the fixture's serial scanner (default: the scanner port's timeout); scan a label meanwhile",
        };
        var command = new Command("probe", "Open every instrument of a fixture and show who answers and one reading each")
        {
            fixture, serial, seed, scanWait,
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
            if (parse.GetValue(scanWait) is { } wait && !(wait > 0 && wait <= 600))
            {
                return context.BadInput("--scan-wait must be more than 0 and at most 600 seconds");
            }

            var scanner = new ScannerProbe(fx.Scanner, parse.GetValue(scanWait), context);
            if (fx.Rig == "serial")
            {
                using var rig = SerialRig.Open(fx, context.Loggers);
                return await ProbeAsync(context, fx, rig, "", scanner, ct).ConfigureAwait(false);
            }

            if (!parse.GetValue(serial))
            {
                if (scanner.IsSerial)
                {
                    // The scanner is real even when the instruments are simulated.
                    context.Output.WriteLine($"Probing fixture {fx.Id}: its serial scanner only (add --serial to probe the simulated instruments through pseudo-terminal ports)");
                    return Report(context, [await scanner.RunAsync(ct).ConfigureAwait(false)]);
                }

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
            return await ProbeAsync(context, twins.Fixture, twins.Drivers, " (simulated, over pseudo-terminal ports)", scanner, ct).ConfigureAwait(false);
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

    private static async Task<int> ProbeAsync(CliContext context, FixtureDefinition fixture, SerialRig rig, string note, ScannerProbe scanner, CancellationToken ct)
    {
        var count = (fixture.SourceMeter is null ? 3 : 4) + fixture.Slots.Count + (scanner.IsSerial ? 1 : 0);
        context.Output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"Probing fixture {fixture.Id}{note}: {count} instruments"));
        var results = (await RigProbe.RunAsync(rig, fixture.Slots.Count > 0 ? fixture.Slots[0].OutputChannel : 1, ct).ConfigureAwait(false)).ToList();
        if (scanner.IsSerial)
        {
            results.Add(await scanner.RunAsync(ct).ConfigureAwait(false));
        }

        return Report(context, results);
    }

    private static int Report(CliContext context, IReadOnlyList<ProbeResult> results)
    {
        var output = context.Output;
        var inv = CultureInfo.InvariantCulture;
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

    /// <summary>The fixture's serial scanner, if it has one, and how long to listen to it.</summary>
    private sealed class ScannerProbe(ScannerDefinition? definition, double? waitSeconds, CliContext context)
    {
        public bool IsSerial => definition is { Kind: "serial", Port: not null };

        public async Task<ProbeResult> RunAsync(CancellationToken ct)
        {
            var port = definition!.Port!;
            using var scanner = new SerialScanner(port, context.Loggers.CreateLogger<SerialScanner>(), TimeProvider.System);
            var listen = waitSeconds is { } seconds ? TimeSpan.FromSeconds(seconds) : TimeSpan.FromMilliseconds(port.TimeoutMs);
            return await RigProbe.ProbeScannerAsync(scanner, listen, ct).ConfigureAwait(false);
        }
    }
}
