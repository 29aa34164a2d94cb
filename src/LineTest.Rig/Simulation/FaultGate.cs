namespace LineTest.Rig.Simulation;

/// <summary>
/// The command-counted faults armed on one simulated instrument. Each command asks the gate whether a fault holds;
/// a fault armed with <see cref="RigFault.AfterCommands"/> = N lets N commands through first.
/// Not thread-safe: the owning instrument calls it under its own lock.
/// </summary>
internal sealed class FaultGate
{
    private readonly List<ArmedFault> _armed = [];

    public void Arm(RigFault fault) => _armed.Add(new ArmedFault(fault) { Remaining = fault.AfterCommands });

    public void Clear() => _armed.Clear();

    public bool IsEmpty => _armed.Count == 0;

    /// <summary>Counts one command and returns the first fault that holds for it, or null.</summary>
    public RigFault? OnCommand()
    {
        RigFault? holding = null;
        foreach (var armed in _armed)
        {
            if (armed.Remaining > 0)
            {
                armed.Remaining--;
            }
            else
            {
                holding ??= armed.Fault;
            }
        }

        return holding;
    }

    private sealed class ArmedFault(RigFault fault)
    {
        public RigFault Fault { get; } = fault;

        public int Remaining { get; set; }
    }
}
