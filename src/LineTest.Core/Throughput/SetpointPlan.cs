using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;
using LineTest.Core.Sequences.Steps;

namespace LineTest.Core.Throughput;

/// <summary>
/// Chooses the order in which a sequence's independent settle blocks are visited. A block is a settle step followed
/// only by measure or verify steps at its setpoint; a run of such blocks with nothing else between them is a group,
/// and blocks within a group do not depend on each other (a step whose kind is a <see cref="PlannerRole.Barrier"/>, such
/// as a trim, prompt, identify, supply-current or iv-sweep step, ends the group). For a sequence whose <c>setpointOrder</c> is <c>free</c>, each group is visited in the order with the
/// least predicted source travel (<see cref="ThermalBound.TravelSeconds"/>) from where the block is, through the
/// group, to the setpoint that follows it; ties keep the file order. When a step after the group reads at a setpoint
/// before any settle of its own (a verify after the trim, in the block the group left the source at), the block at
/// that setpoint stays last in the group. A <c>fixed</c> sequence is returned unchanged.
/// </summary>
/// <remarks>
/// Travel is the only part of a batch's time that depends on the order (stability windows, soaks and measurements
/// are the same whatever the order), so the order chosen here is also the one that gives the lowest thermal bound.
/// Groups of up to <see cref="ExhaustiveLimit"/> blocks are searched exhaustively; longer ones nearest-first.
/// </remarks>
public static class SetpointPlan
{
    /// <summary>Largest group searched over every permutation (6! = 720 orders).</summary>
    public const int ExhaustiveLimit = 6;

    /// <summary>The steps in the order to run them, starting with the block at <paramref name="startC"/>.</summary>
    public static IReadOnlyList<StepDefinition> Order(SequenceDefinition sequence, SourceDefinition source, double startC)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        ArgumentNullException.ThrowIfNull(source);
        if (!string.Equals(sequence.SetpointOrder, SetpointOrders.Free, StringComparison.Ordinal))
        {
            return sequence.Steps;
        }

        var celsius = sequence.Setpoints.ToDictionary(s => s.Name, s => s.Celsius, StringComparer.Ordinal);
        var steps = sequence.Steps;
        var result = new List<StepDefinition>(steps.Count);
        var current = startC;
        var i = 0;
        while (i < steps.Count)
        {
            var blocks = GroupAt(steps, i);
            if (blocks.Count == 0)
            {
                if (SettlesAt(steps[i]) is { } lone && celsius.TryGetValue(lone, out var c))
                {
                    current = c;
                }

                result.Add(steps[i]);
                i++;
                continue;
            }

            var consumed = blocks.Sum(b => b.Count);
            double? nextC = NextSettle(steps, i + consumed) is { } next && celsius.TryGetValue(next, out var n) ? n : null;
            var targets = blocks.Select(b => celsius.TryGetValue(SettlesAt(b[0])!, out var t) ? t : current).ToArray();
            var pinned = ReadBeforeNextSettle(steps, i + consumed) is { } reads
                ? blocks.FindLastIndex(b => string.Equals(SettlesAt(b[0]), reads, StringComparison.Ordinal))
                : -1;
            var order = BestOrder(source, sequence.Stability.BandC, current, targets, nextC, pinned < 0 ? null : pinned);
            foreach (var index in order)
            {
                result.AddRange(blocks[index]);
            }

            current = targets[order[^1]];
            i += consumed;
        }

        return result;
    }

    /// <summary>The sequence with its steps in the order <see cref="Order"/> chooses.</summary>
    public static SequenceDefinition Apply(SequenceDefinition sequence, SourceDefinition source, double startC)
    {
        ArgumentNullException.ThrowIfNull(sequence);
        var steps = Order(sequence, source, startC);
        return ReferenceEquals(steps, sequence.Steps) ? sequence : sequence with { Steps = steps };
    }

    /// <summary>The blocks of the group starting at <paramref name="start"/>; empty when fewer than two blocks start there.</summary>
    private static List<List<StepDefinition>> GroupAt(IReadOnlyList<StepDefinition> steps, int start)
    {
        var blocks = new List<List<StepDefinition>>();
        var i = start;
        while (i < steps.Count && SettlesAt(steps[i]) is { } setpoint)
        {
            var block = new List<StepDefinition> { steps[i] };
            var j = i + 1;
            while (j < steps.Count && ReadsAt(steps[j], setpoint))
            {
                block.Add(steps[j]);
                j++;
            }

            if (block.Count == 1)
            {
                break;
            }

            blocks.Add(block);
            i = j;
        }

        return blocks.Count >= 2 ? blocks : [];
    }

    /// <summary>Whether <paramref name="step"/> reads at <paramref name="setpoint"/> and so moves with that setpoint's block.</summary>
    private static bool ReadsAt(StepDefinition step, string setpoint) =>
        StepKinds.Of(step) is { PlannerRole: PlannerRole.ReadsInBlock } kind
        && string.Equals(kind.SetpointOf(step), setpoint, StringComparison.Ordinal);

    /// <summary>The setpoint <paramref name="step"/> brings the source to when it starts a settle block; otherwise null.</summary>
    private static string? SettlesAt(StepDefinition step) =>
        StepKinds.Of(step) is { PlannerRole: PlannerRole.Settle } kind ? kind.SetpointOf(step) : null;

    private static string? NextSettle(IReadOnlyList<StepDefinition> steps, int from)
    {
        for (var i = from; i < steps.Count; i++)
        {
            if (SettlesAt(steps[i]) is { } setpoint)
            {
                return setpoint;
            }
        }

        return null;
    }

    /// <summary>The setpoint the first step from <paramref name="from"/> reads at, if it does so before any settle step; otherwise null.</summary>
    private static string? ReadBeforeNextSettle(IReadOnlyList<StepDefinition> steps, int from)
    {
        for (var i = from; i < steps.Count && SettlesAt(steps[i]) is null; i++)
        {
            if (StepKinds.SetpointOf(steps[i]) is { } setpoint)
            {
                return setpoint;
            }
        }

        return null;
    }

    /// <summary>The order of least travel; with <paramref name="last"/>, only orders that end with that block.</summary>
    private static int[] BestOrder(SourceDefinition source, double bandC, double startC, double[] targets, double? nextC, int? last)
    {
        var identity = Enumerable.Range(0, targets.Length).ToArray();
        if (targets.Length > ExhaustiveLimit)
        {
            if (last is not { } keep)
            {
                return NearestFirst(startC, targets);
            }

            var others = identity.Where(k => k != keep).ToArray();
            return [.. NearestFirst(startC, others.Select(k => targets[k]).ToArray()).Select(k => others[k]), keep];
        }

        int[]? best = null;
        var bestSeconds = double.PositiveInfinity;

        // File order first, so that ties keep it (the permutations start with it too, but may be refused below).
        foreach (var order in Permutations(identity).Prepend(identity))
        {
            if (last is { } keep && order[^1] != keep)
            {
                continue;
            }

            var seconds = Travel(source, bandC, startC, targets, order, nextC);

            // A strictly shorter travel only (with a little slack against rounding), so ties keep the file order.
            if (best is null || seconds < bestSeconds - 1e-9)
            {
                best = order;
                bestSeconds = seconds;
            }
        }

        return best!;
    }

    private static double Travel(SourceDefinition source, double bandC, double startC, double[] targets, int[] order, double? nextC)
    {
        var total = 0.0;
        var at = startC;
        foreach (var index in order)
        {
            total += ThermalBound.TravelSeconds(source, at, targets[index], bandC);
            at = targets[index];
        }

        return nextC is { } next ? total + ThermalBound.TravelSeconds(source, at, next, bandC) : total;
    }

    private static int[] NearestFirst(double startC, double[] targets)
    {
        var left = Enumerable.Range(0, targets.Length).ToList();
        var order = new int[targets.Length];
        var at = startC;
        for (var k = 0; k < order.Length; k++)
        {
            var here = at;
            var pick = left.MinBy(i => Math.Abs(targets[i] - here));
            order[k] = pick;
            left.Remove(pick);
            at = targets[pick];
        }

        return order;
    }

    private static IEnumerable<int[]> Permutations(int[] items)
    {
        if (items.Length <= 1)
        {
            yield return items;
            yield break;
        }

        for (var i = 0; i < items.Length; i++)
        {
            var rest = items.Where((_, k) => k != i).ToArray();
            foreach (var tail in Permutations(rest))
            {
                yield return [items[i], .. tail];
            }
        }
    }
}
