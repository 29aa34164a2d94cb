using System.Globalization;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Scanner;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Rigs;

/// <summary>
/// Opens every instrument of a serial rig in turn, asks who it is and takes one reading, and says exactly why when it
/// cannot: the port is missing, nothing answers within the timeout, the identity or reading makes no sense (another
/// instrument on the port), or the instrument reports an error (its error queue is not empty).
/// </summary>
public static class RigProbe
{
    /// <summary>Probes the source, reference, meter, the source-measure unit if there is one, and every unit link, in that order.</summary>
    /// <param name="rig">The rig.</param>
    /// <param name="meterChannel">The channel the meter reads for its one reading (a slot's output channel).</param>
    /// <param name="cancellationToken">Cancels the probe.</param>
    public static async Task<IReadOnlyList<ProbeResult>> RunAsync(SerialRig rig, int meterChannel, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(rig);
        var results = new List<ProbeResult>
        {
            await ProbeAsync(rig.Source, async ct => Celsius(await rig.Source.ReadTemperatureAsync(ct).ConfigureAwait(false)), cancellationToken).ConfigureAwait(false),
            await ProbeAsync(rig.Reference, async ct => Raw(await rig.Reference.ReadRawAsync(ct).ConfigureAwait(false)), cancellationToken).ConfigureAwait(false),
            await ProbeAsync(rig.Meter, async ct =>
            {
                await rig.Meter.ConfigureAsync(ct).ConfigureAwait(false);
                var volts = await rig.Meter.ReadDcVoltsAsync(meterChannel, ct).ConfigureAwait(false);
                return string.Create(CultureInfo.InvariantCulture, $"channel {meterChannel}: {volts:F6} V");
            }, cancellationToken).ConfigureAwait(false),
        };
        if (rig.SourceMeter is { } smu)
        {
            // With its output off the SMU forces no current: its reading is the open-terminal voltage, about 0 V.
            results.Add(await ProbeAsync(smu, async ct =>
            {
                await smu.ConfigureAsync(ct).ConfigureAwait(false);
                var reading = await smu.MeasureVoltsAsync(ct).ConfigureAwait(false);
                return string.Create(CultureInfo.InvariantCulture, $"output off: {reading.Volts:F6} V{(reading.InCompliance ? " (in compliance)" : string.Empty)}");
            }, cancellationToken).ConfigureAwait(false));
        }

        foreach (var (slot, link) in rig.UnitLinks.OrderBy(p => p.Key))
        {
            results.Add(await ProbeUnitAsync(slot, link.Line, link, cancellationToken).ConfigureAwait(false));
        }

        return results;
    }

    /// <summary>
    /// Probes a serial scanner. A scanner only sends, so there is no identity to ask: its port is opened and listened
    /// to for <paramref name="listen"/>. A code scanned meanwhile is shown; bytes that are not a serial point to a wrong
    /// baud rate or line end; silence only proves that the port opens.
    /// </summary>
    public static async Task<ProbeResult> ProbeScannerAsync(SerialScanner scanner, TimeSpan listen, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(scanner);
        const string Name = "scanner";
        const string Identity = "listens only";
        var port = scanner.Port.Name;
        using var window = CancellationTokenSource.CreateLinkedTokenSource(cancellationToken);
        window.CancelAfter(listen);
        try
        {
            var scan = await scanner.NextAsync(window.Token).ConfigureAwait(false);
            return scan.Serial is { } serial
                ? new ProbeResult(Name, port, ProbeStatus.Usable, Identity, $"scanned '{serial}'", null)
                : new ProbeResult(Name, port, ProbeStatus.Unusable, Identity, null,
                    $"what came is not a serial ({scan.Problem}): check the scanner's baud rate and that it sends CR or LF after each code");
        }
        catch (OperationCanceledException) when (!cancellationToken.IsCancellationRequested)
        {
            return new ProbeResult(Name, port, ProbeStatus.Usable, Identity,
                string.Create(CultureInfo.InvariantCulture, $"port opens; nothing scanned within {listen.TotalSeconds:0.#} s (scan a label while probing to see a code)"), null);
        }
        catch (InstrumentFaultException fault)
        {
            return new ProbeResult(Name, port, ProbeStatus.Unusable, null, null, fault.Message);
        }
    }

    private static string Celsius(double value) => string.Create(CultureInfo.InvariantCulture, $"{value:F3} °C");

    private static string Raw(double value) => string.Create(CultureInfo.InvariantCulture, $"{value:G10} (raw)");

    private static async Task<ProbeResult> ProbeAsync(IIdentifiableInstrument instrument, Func<CancellationToken, Task<string>> read, CancellationToken ct)
    {
        var line = instrument.Line;
        InstrumentIdentity identity;
        try
        {
            identity = await instrument.IdentifyAsync(ct).ConfigureAwait(false);
        }
        catch (InstrumentFaultException fault)
        {
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.Unusable, null, null, fault.Message);
        }

        try
        {
            var reading = await read(ct).ConfigureAwait(false);
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.Usable, identity.ToString(), reading, null);
        }
        catch (InstrumentFaultException fault)
        {
            var why = fault.Kind is InstrumentFaultKind.GarbageReply or InstrumentFaultKind.InstrumentError
                ? $"{fault.Message} (it says it is '{identity}': is the right instrument on this port?)"
                : fault.Message;
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.Unusable, identity.ToString(), null, why);
        }
    }

    private static async Task<ProbeResult> ProbeUnitAsync(int slot, SerialLine line, IUnitLink link, CancellationToken ct)
    {
        try
        {
            var id = await link.IdentifyAsync(ct).ConfigureAwait(false);
            var raw = await link.ReadRawAsync(ct).ConfigureAwait(false);
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.Usable, $"{id.Serial} {id.Product} firmware {id.Firmware}",
                string.Create(CultureInfo.InvariantCulture, $"{raw} counts"), null);
        }
        catch (InstrumentFaultException fault) when (fault.Kind == InstrumentFaultKind.NoAnswer)
        {
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.NoUnit, null, null,
                $"the port opens but no unit answered in slot {slot}: load a unit to check the link ({fault.Message})");
        }
        catch (InstrumentFaultException fault)
        {
            return new ProbeResult(line.Name, line.Port.Name, ProbeStatus.Unusable, null, null, fault.Message);
        }
    }
}
