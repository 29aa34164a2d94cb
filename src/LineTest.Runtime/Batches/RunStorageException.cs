namespace LineTest.Runtime.Batches;

/// <summary>A finished run could not be stored. The station must stop taking new units and say so loudly.</summary>
public sealed class RunStorageException : Exception
{
    public RunStorageException()
    {
    }

    public RunStorageException(string message)
        : base(message)
    {
    }

    public RunStorageException(string message, Exception innerException)
        : base(message, innerException)
    {
    }
}
