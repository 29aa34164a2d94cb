namespace LineTest.Factory.Schema;

/// <summary>The factory database's schema cannot be used by this LineTest; the message says why and what to do.</summary>
public sealed class FactorySchemaException : Exception
{
    /// <summary>Creates the exception.</summary>
    public FactorySchemaException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception.</summary>
    public FactorySchemaException()
    {
    }

    /// <summary>Creates the exception.</summary>
    public FactorySchemaException(string message, Exception innerException)
        : base(message, innerException)
    {
    }
}
