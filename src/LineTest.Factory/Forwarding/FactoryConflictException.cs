namespace LineTest.Factory.Forwarding;

/// <summary>A batch met a run id written meanwhile by another forwarder; the batch was rolled back and is retried.</summary>
public sealed class FactoryConflictException : Exception
{
    /// <summary>Creates the exception.</summary>
    public FactoryConflictException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception.</summary>
    public FactoryConflictException()
    {
    }

    /// <summary>Creates the exception.</summary>
    public FactoryConflictException(string message, Exception innerException)
        : base(message, innerException)
    {
    }
}
