using LineTest.Core.Definitions;

namespace LineTest.Core.Trims;

/// <summary>
/// Sequence parameters of a gain-and-offset DAC trim. The unit's output is modelled as
/// <c>V = G(g)·u(T) + O(o)</c> where <c>u(T)</c> is the unknown, linear sensor chain,
/// <c>G(g) = G_design·(1 + Gain.Step·(g − Gain.Nominal))</c> (a fractional gain change per code) and
/// <c>O(o) = Offset.Step·(o − Offset.Nominal)</c> volts (an offset summed after the gain stage).
/// The target transfer function is <c>V = Target.OffsetVolts + Target.SlopeVoltsPerC·T</c>.
/// </summary>
public sealed record DacTrimSpec
{
    /// <summary>The gain DAC: Step is the fractional gain change per code.</summary>
    public required DacChannelSpec Gain { get; init; }

    /// <summary>The offset DAC: Step is volts per code at the output.</summary>
    public required DacChannelSpec Offset { get; init; }

    /// <summary>The transfer function the trimmed unit must follow.</summary>
    public required LinearTransfer Target { get; init; }

    /// <summary>
    /// Optional: after writing, read the output this many times with the calibration codes and with the new codes
    /// (alternating, A B B A …) and take the real DACs' step error out with the offset DAC (<see cref="DacCheck"/>);
    /// null for no check.
    /// </summary>
    public int? CheckPairs { get; init; }

    /// <summary>
    /// Problems that make the spec unusable, each with its path relative to the spec (e.g. <c>gain.step</c>);
    /// empty when the spec is sound. The sequence checker reports these; the trim refuses to run with any.
    /// </summary>
    public IReadOnlyList<SpecProblem> Check()
    {
        var problems = new List<SpecProblem>();
        CheckChannel("gain", Gain, problems);
        CheckChannel("offset", Offset, problems);
        if (CheckPairs is { } pairs && DefinitionBounds.DacCheckPairs.Refusal(pairs) is { } pairsReason)
        {
            problems.Add(new("checkPairs", pairsReason));
        }
        if (Target is null)
        {
            problems.Add(new("target", "missing"));
        }
        else
        {
            if (DefinitionBounds.TransferOffsetVolts.Refusal(Target.OffsetVolts) is { } offset)
            {
                problems.Add(new("target.offsetVolts", offset));
            }

            if (!double.IsFinite(Target.SlopeVoltsPerC) || Target.SlopeVoltsPerC == 0.0)
            {
                problems.Add(new("target.slopeVoltsPerC", "must be a finite number other than 0"));
            }
        }

        return problems;
    }

    private static void CheckChannel(string path, DacChannelSpec? channel, List<SpecProblem> problems)
    {
        if (channel is null)
        {
            problems.Add(new(path, "missing"));
            return;
        }

        foreach (var (key, code) in new[] { ("min", channel.Min), ("max", channel.Max), ("nominal", channel.Nominal) })
        {
            if (DefinitionBounds.DacCode.Refusal(code) is { } reason)
            {
                problems.Add(new($"{path}.{key}", reason));
            }
        }

        if (channel.Min >= channel.Max)
        {
            problems.Add(new($"{path}.min", $"min ({channel.Min}) must be below max ({channel.Max})"));
        }
        else if (channel.Nominal < channel.Min || channel.Nominal > channel.Max)
        {
            problems.Add(new($"{path}.nominal", $"nominal code {channel.Nominal} is outside {channel.Min} … {channel.Max}"));
        }

        if (!double.IsFinite(channel.Step) || channel.Step == 0.0)
        {
            problems.Add(new($"{path}.step", "must be a finite number other than 0"));
        }

        if (DefinitionBounds.RegisterName.Refusal(channel.Register) is { } register)
        {
            problems.Add(new($"{path}.register", register));
        }
    }
}

/// <summary>One DAC: its code range, the code the unit ships with, and what one code does.</summary>
public sealed record DacChannelSpec
{
    /// <summary>Lowest allowed code.</summary>
    public required long Min { get; init; }

    /// <summary>Highest allowed code.</summary>
    public required long Max { get; init; }

    /// <summary>Code the unit carries before trim (and the zero of the DAC's effect).</summary>
    public required long Nominal { get; init; }

    /// <summary>Effect of one code (fraction of gain, or volts).</summary>
    public required double Step { get; init; }

    /// <summary>Register name written over the unit link, e.g. <c>GAIN</c>.</summary>
    public required string Register { get; init; }
}

/// <summary>A straight-line transfer function: output volts = OffsetVolts + SlopeVoltsPerC·T.</summary>
public sealed record LinearTransfer
{
    /// <summary>Output at 0 °C, volts.</summary>
    public required double OffsetVolts { get; init; }

    /// <summary>Output change per °C, volts.</summary>
    public required double SlopeVoltsPerC { get; init; }

    /// <summary>The temperature this transfer function indicates for an output voltage.</summary>
    public double IndicatedC(double volts) => (volts - OffsetVolts) / SlopeVoltsPerC;

    /// <summary>The output voltage this transfer function gives at a temperature.</summary>
    public double VoltsAt(double celsius) => OffsetVolts + SlopeVoltsPerC * celsius;
}
