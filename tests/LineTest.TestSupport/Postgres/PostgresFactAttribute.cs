using Xunit;

namespace LineTest.TestSupport.Postgres;

/// <summary>A test against the real server of <see cref="TestPostgres"/>: skipped with the reason outside CI when there is none.</summary>
public sealed class PostgresFactAttribute : FactAttribute
{
    public PostgresFactAttribute()
    {
        if (TestPostgres.SkipReason is { } reason)
        {
            Skip = reason;
        }
    }
}
