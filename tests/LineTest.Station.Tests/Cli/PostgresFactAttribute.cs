namespace LineTest.Station.Tests.Cli;

/// <summary>
/// A command-line test against the real PostgreSQL server of <c>LINETEST_TEST_POSTGRES</c> (exported by .ci/run):
/// skipped with the reason outside CI when it is absent; in CI (<c>CI=true</c>) it runs and fails without it.
/// </summary>
public sealed class PostgresFactAttribute : FactAttribute
{
    public PostgresFactAttribute()
    {
        if (string.IsNullOrEmpty(Environment.GetEnvironmentVariable("LINETEST_TEST_POSTGRES"))
            && !string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase))
        {
            Skip = "needs a PostgreSQL server: set LINETEST_TEST_POSTGRES (an Npgsql connection string), as .ci/run does";
        }
    }
}
