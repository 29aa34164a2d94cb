using LineTest.Factory.Schema;
using LineTest.Factory.Verification;
using Microsoft.Data.Sqlite;
using Npgsql;

namespace LineTest.Station.Cli;

/// <summary>
/// <c>linetest verify --factory CONN [--station ID] [--results DIR]</c>: proves every station's record complete and
/// unedited on the factory database and, given a station's folder, compares the factory's copy with the station's
/// own chain, its watermark and its <c>results.head</c>. Exit 0 intact, 1 something changed or missing, 2 bad input.
/// </summary>
internal static class FactoryVerify
{
    public static async Task<int> RunAsync(CliContext context, string connectionString, string? station, string? resultsDirectory, CancellationToken ct)
    {
        NpgsqlDataSource dataSource;
        try
        {
            dataSource = FactoryConnection.Create(connectionString);
        }
        catch (ArgumentException ex)
        {
            return context.BadInput($"--factory is not a usable connection string: {ex.Message}");
        }

        await using (dataSource)
        {
            var where = FactoryConnection.Describe(dataSource);
            try
            {
                string factoryId;
                try
                {
                    await using var id = dataSource.CreateCommand("SELECT id FROM factory_identity ORDER BY created_utc LIMIT 1;");
                    factoryId = ((Guid)(await id.ExecuteScalarAsync(ct).ConfigureAwait(false))!).ToString("D");
                }
                catch (PostgresException ex) when (ex.SqlState == PostgresErrorCodes.UndefinedTable)
                {
                    return context.BadInput($"{where} is not a LineTest factory database (no runs were ever forwarded to it)");
                }

                var checks = await FactoryVerifier.VerifyAsync(dataSource, station, ct).ConfigureAwait(false);
                if (station is not null && checks.Count == 0)
                {
                    return context.BadInput($"{where} holds no runs of station {station}");
                }

                var intact = true;
                foreach (var check in checks)
                {
                    intact &= Print(context, check, check.FirstProblem);
                }

                if (resultsDirectory is not null)
                {
                    intact &= CompareWithStation(context, checks, resultsDirectory, factoryId);
                }

                await using var alarms = dataSource.CreateCommand("SELECT count(*) FROM alarms;");
                var alarmCount = (long)(await alarms.ExecuteScalarAsync(ct).ConfigureAwait(false))!;
                if (alarmCount > 0)
                {
                    context.Output.WriteLine($"{where}: {alarmCount} refused run(s) recorded in table alarms (never stored over the runs held)");
                }

                context.Output.WriteLine(intact
                    ? $"{where}: intact, {checks.Count} station database(s), {checks.Sum(c => c.RunsChecked)} runs"
                    : $"{where}: NOT INTACT");
                return intact ? ExitCodes.Done : ExitCodes.RuntimeFailure;
            }
            catch (NpgsqlException ex)
            {
                context.Error.WriteLine($"linetest: {where} cannot be read: {ex.Message}");
                return ExitCodes.RuntimeFailure;
            }
            catch (Exception ex) when (ex is SqliteException or FileNotFoundException)
            {
                return context.BadInput($"the station folder {resultsDirectory} cannot be read: {ex.Message}");
            }
        }
    }

    private static bool Print(CliContext context, ChainCheck check, FactoryProblem? problem)
    {
        var name = $"station {check.Station} (database {check.ChainId:N})";
        if (problem is null)
        {
            context.Output.WriteLine($"  {name}: intact, {check.RunsChecked} runs, head {check.HeadSeq}:{check.HeadSha256}");
            return true;
        }

        context.Output.WriteLine($"  {name}: NOT INTACT after checking {check.RunsChecked} runs");
        context.Output.WriteLine($"    first problem: {problem.Kind} at seq {problem.StationSeq}{(problem.RunId is { } id ? $" (run {id:D})" : string.Empty)}: {problem.Message}");
        return false;
    }

    private static bool CompareWithStation(CliContext context, IReadOnlyList<ChainCheck> checks, string resultsDirectory, string factoryId)
    {
        var side = StationSide.Read(resultsDirectory, factoryId);
        var check = side.ChainId is { } chain ? checks.FirstOrDefault(c => c.ChainId == Guid.ParseExact(chain, "N")) : null;
        context.Output.WriteLine($"  compared with {resultsDirectory}: the station says the factory committed up to seq {side.ForwardedThroughSeq}");
        if (check is null)
        {
            if (side.ForwardedThroughSeq > 0)
            {
                context.Output.WriteLine($"    problem: the factory holds none of this station's runs, though it committed up to seq {side.ForwardedThroughSeq}");
                return false;
            }

            context.Output.WriteLine("    nothing of this station was forwarded to this factory database yet");
            return true;
        }

        var problem = FactoryVerifier.CompareWithStation(check, side.HashAt, side.ForwardedThroughSeq);
        if (problem is null && side.HeadFile is var (headSeq, headHash))
        {
            if (headSeq < check.HeadSeq)
            {
                problem = new FactoryProblem("ahead-of-station", check.HeadSeq, null, $"the factory holds runs up to seq {check.HeadSeq}, past the station's results.head ({headSeq})");
            }
            else if (headSeq == check.HeadSeq && !string.Equals(headHash, check.HeadSha256, StringComparison.Ordinal))
            {
                problem = new FactoryProblem("differs-from-station", headSeq, null, $"the station's results.head at seq {headSeq} is {headHash[..12]}…, the factory's is {check.HeadSha256[..12]}…");
            }
            else
            {
                context.Output.WriteLine($"    results.head {headSeq}:{headHash[..12]}… agrees");
            }
        }

        if (problem is null)
        {
            context.Output.WriteLine($"    agrees: the factory holds the station's chain up to seq {check.HeadSeq}");
            return true;
        }

        context.Output.WriteLine($"    problem: {problem.Kind}: {problem.Message}");
        return false;
    }
}
