namespace LineTest.Storage.Store;

/// <summary>
/// A run could not be stored, or the store could not be opened. The message is written for the person at the
/// station: what failed, where, and what to do. The runtime stops taking units when it sees this.
/// </summary>
public sealed class ResultStoreException : Exception
{
    /// <summary>Creates the exception.</summary>
    public ResultStoreException(ResultStoreFailure failure, string message, Exception? innerException = null)
        : base(message, innerException)
    {
        Failure = failure;
    }

    /// <summary>Creates the exception with <see cref="ResultStoreFailure.Other"/>.</summary>
    public ResultStoreException()
        : this(ResultStoreFailure.Other, "The result store failed.")
    {
    }

    /// <summary>Creates the exception with <see cref="ResultStoreFailure.Other"/>.</summary>
    public ResultStoreException(string message)
        : this(ResultStoreFailure.Other, message)
    {
    }

    /// <summary>Creates the exception with <see cref="ResultStoreFailure.Other"/>.</summary>
    public ResultStoreException(string message, Exception innerException)
        : this(ResultStoreFailure.Other, message, innerException)
    {
    }

    /// <summary>The kind of failure, for the runtime's decision and for logs.</summary>
    public ResultStoreFailure Failure { get; }
}
