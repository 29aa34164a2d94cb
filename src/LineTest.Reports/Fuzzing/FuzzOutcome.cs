namespace LineTest.Reports.Fuzzing;

/// <summary>What one fuzzed report input did.</summary>
public enum FuzzOutcome
{
    /// <summary>A report was made in every format (exit 0).</summary>
    Reported,

    /// <summary>The input was refused with a reason (exit 2), or the store reported a runtime failure (exit 1).</summary>
    Refused,

    /// <summary>Something threw that the command would not catch: a stack trace. Always a bug.</summary>
    Crashed,
}
