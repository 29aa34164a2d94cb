namespace LineTest.Runtime.Batches;

/// <summary>A fault that stops the whole batch (the source, the reference or the meter is lost, or the source never settled).</summary>
public sealed class BatchFaultException : Exception
{
    public BatchFaultException()
    {
    }

    public BatchFaultException(string message)
        : base(message)
    {
    }

    public BatchFaultException(string message, Exception innerException)
        : base(message, innerException)
    {
    }
}
