namespace LineTest.Runtime.Batches;

/// <summary>A fault confined to one unit (its link stopped answering, wrong identity, read-back mismatch).</summary>
public sealed class UnitFaultException : Exception
{
    public UnitFaultException()
    {
    }

    public UnitFaultException(string message)
        : base(message)
    {
    }

    public UnitFaultException(string message, Exception innerException)
        : base(message, innerException)
    {
    }
}
