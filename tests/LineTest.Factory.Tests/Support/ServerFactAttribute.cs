namespace LineTest.Factory.Tests.Support;

/// <summary>
/// A test that starts and stops a PostgreSQL server of its own (<see cref="ThrowawayServer"/>): skipped with the reason
/// outside CI when no server is installed; in CI it runs (and fails without one).
/// </summary>
public sealed class ServerFactAttribute : FactAttribute
{
    public ServerFactAttribute()
    {
        if (ThrowawayServer.FindBin() is null && !TestPostgres.InCi)
        {
            Skip = "needs Debian's postgresql package (/usr/lib/postgresql/*/bin) to start and stop a server of its own";
        }
    }
}
