namespace LineTest.Storage.Chain;

/// <summary>What kind of tampering (or damage) the chain check found.</summary>
public enum ChainProblemKind
{
    /// <summary>A run's stored JSON, its hash, or one of its columns no longer matches what was written.</summary>
    RunChanged,

    /// <summary>A run's rows in the readings table differ from the readings in its stored JSON.</summary>
    ReadingsChanged,

    /// <summary>A run is missing: a gap in the insertion order, readings without their run, or a broken link.</summary>
    RunMissing,

    /// <summary>A run was put between runs that were written one after the other.</summary>
    RunInserted,
}
