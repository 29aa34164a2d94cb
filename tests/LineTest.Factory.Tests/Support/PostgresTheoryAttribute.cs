namespace LineTest.Factory.Tests.Support;

/// <summary>A theory against the real server of <see cref="TestPostgres"/>: skipped with the reason outside CI when there is none.</summary>
public sealed class PostgresTheoryAttribute : TheoryAttribute
{
    public PostgresTheoryAttribute()
    {
        if (TestPostgres.SkipReason is { } reason)
        {
            Skip = reason;
        }
    }
}
