namespace LineTest.Storage.Store;

/// <summary>Why a result store could not open or write.</summary>
public enum ResultStoreFailure
{
    /// <summary>A cause not listed below; the message carries the database engine's own words.</summary>
    Other,

    /// <summary>The disk or file system holding the results is full.</summary>
    DiskFull,

    /// <summary>The results file or folder is read-only.</summary>
    ReadOnly,

    /// <summary>Another program holds a lock on the results database for too long.</summary>
    Locked,

    /// <summary>The results file or folder cannot be created or opened.</summary>
    CannotOpen,

    /// <summary>The file is damaged, is not a LineTest results database, or was made by a newer LineTest.</summary>
    Incompatible,

    /// <summary>The run was refused, e.g. a run with the same id is already stored.</summary>
    Rejected,

    /// <summary>The disk reported an input/output error.</summary>
    DiskError,

    /// <summary>Another LineTest process holds the results folder's writer lock.</summary>
    InUse,
}
