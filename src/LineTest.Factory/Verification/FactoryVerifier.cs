using System.Text.Json;
using LineTest.Core.Results;
using LineTest.Factory.Forwarding;
using LineTest.Storage.Chain;
using LineTest.Storage.Json;
using Npgsql;

namespace LineTest.Factory.Verification;

/// <summary>
/// Proves, per station database, that the factory holds its runs complete and unedited: walks each chain in seq
/// order recomputing every record hash from the stored text and the previous hash, checks the link to the run before
/// (a deleted or inserted run breaks it), the columns reports read against the text, every readings row against the
/// run's readings, and the last run against the chain's head (runs deleted from the end). A forger who also rewrites
/// the chain's head is caught by comparing with the station's own head (<see cref="CompareWithStation"/>).
/// </summary>
public static class FactoryVerifier
{
    private const string RunSelect = """
        SELECT r.station_seq, r.run_id, r.prev_sha256, r.record_sha256, r.run_json, r.serial, r.verdict, r.ended_ticks, r.slot,
               r.lot, r.station, r.reading_count, r.sequence_id, r.sequence_revision, r.reason, r.first_failing_reading,
               (SELECT json_agg(json_build_array(g.name, g.value, g.unit, g.low, g.high, g.verdict) ORDER BY g.ordinal)
                  FROM readings g
                 WHERE g.ended_utc = r.ended_utc AND g.ended_ticks = r.ended_ticks AND g.station = r.station
                   AND g.chain_id = r.chain_id AND g.station_seq = r.station_seq)
          FROM runs r WHERE r.chain_id = @c ORDER BY r.station_seq;
        """;

    /// <summary>Checks every chain, or those of <paramref name="station"/>.</summary>
    /// <exception cref="NpgsqlException">The database cannot be read.</exception>
    public static async Task<IReadOnlyList<ChainCheck>> VerifyAsync(NpgsqlDataSource dataSource, string? station = null, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(dataSource);
        var chains = new List<(Guid Id, string Station, long HeadSeq, string HeadHash, long Runs)>();
        await using (var command = dataSource.CreateCommand(
            "SELECT chain_id, station, head_seq, head_sha256, runs FROM chains WHERE @s::text IS NULL OR station = @s ORDER BY station, chain_id;"))
        {
            command.Parameters.AddWithValue("s", NpgsqlTypes.NpgsqlDbType.Text, (object?)station ?? DBNull.Value);
            await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
            while (await reader.ReadAsync(ct).ConfigureAwait(false))
            {
                chains.Add((reader.GetGuid(0), reader.GetString(1), reader.GetInt64(2), reader.GetString(3), reader.GetInt64(4)));
            }
        }

        var checks = new List<ChainCheck>();
        foreach (var chain in chains)
        {
            checks.Add(await VerifyChainAsync(dataSource, chain, ct).ConfigureAwait(false));
        }

        return checks;
    }

    /// <summary>
    /// Compares the factory's chain with the station's own head (from its <c>results.head</c> or its database): the
    /// factory must hold a prefix of the station's chain, at least up to what the station was told was committed.
    /// </summary>
    /// <param name="check">The factory's check of the station's chain.</param>
    /// <param name="stationHashAt">The station's record hash at a seq, or null when the station has no such run.</param>
    /// <param name="forwardedThroughSeq">The station's watermark: the factory committed every run up to it.</param>
    public static FactoryProblem? CompareWithStation(ChainCheck check, Func<long, string?> stationHashAt, long forwardedThroughSeq)
    {
        ArgumentNullException.ThrowIfNull(check);
        ArgumentNullException.ThrowIfNull(stationHashAt);
        if (check.HeadSeq < forwardedThroughSeq)
        {
            return new FactoryProblem(
                "behind-station",
                check.HeadSeq,
                null,
                $"the station was told runs up to seq {forwardedThroughSeq} were committed, but the factory holds only up to seq {check.HeadSeq}: runs were deleted on the server");
        }

        if (check.HeadSeq > 0 && stationHashAt(check.HeadSeq) is { } local && !string.Equals(local, check.HeadSha256, StringComparison.Ordinal))
        {
            return new FactoryProblem(
                "differs-from-station",
                check.HeadSeq,
                null,
                $"the factory's head at seq {check.HeadSeq} is {check.HeadSha256[..12]}…, the station's run there is {local[..12]}…");
        }

        return null;
    }

    private static async Task<ChainCheck> VerifyChainAsync(
        NpgsqlDataSource dataSource, (Guid Id, string Station, long HeadSeq, string HeadHash, long Runs) chain, CancellationToken ct)
    {
        await using var command = dataSource.CreateCommand(RunSelect);
        command.Parameters.AddWithValue("c", chain.Id);
        await using var reader = await command.ExecuteReaderAsync(ct).ConfigureAwait(false);
        var previous = RecordHash.Genesis;
        long seq = 0, count = 0;
        ChainCheck Result(FactoryProblem? problem) => new(chain.Id, chain.Station, count, seq, previous, problem);

        while (await reader.ReadAsync(ct).ConfigureAwait(false))
        {
            seq = reader.GetInt64(0);
            var id = reader.GetGuid(1);
            var prev = reader.GetString(2);
            var record = reader.GetString(3);
            var json = reader.GetString(4);
            FactoryProblem Problem(string kind, string message) => new(kind, seq, id, message);

            if (!string.Equals(prev, previous, StringComparison.Ordinal))
            {
                return Result(Problem("chain-break", $"run seq {seq} does not follow the run before it: a run was deleted or inserted before it"));
            }

            if (!string.Equals(RecordHash.Compute(json, prev), record, StringComparison.Ordinal))
            {
                return Result(Problem("edited", $"run seq {seq} no longer matches its record hash: it was edited on the server"));
            }

            RunRecord run;
            try
            {
                run = RunJson.Deserialize(json);
            }
            catch (JsonException ex)
            {
                return Result(Problem("edited", $"run seq {seq} is not a valid stored run: {ex.Message}"));
            }

            if (ColumnDifference(reader, run) is { } column)
            {
                return Result(Problem("column-edited", $"run seq {seq}: column {column} differs from the stored run"));
            }

            if (ReadingDifference(reader.IsDBNull(16) ? null : reader.GetString(16), run) is { } reading)
            {
                return Result(Problem("readings-edited", $"run seq {seq}: {reading}"));
            }

            previous = record;
            count++;
        }

        if (seq != chain.HeadSeq || !string.Equals(previous, chain.HeadHash, StringComparison.Ordinal) || count != chain.Runs)
        {
            return Result(new FactoryProblem(
                "missing-at-end",
                seq,
                null,
                $"the chain ends at seq {seq} after {count} runs, but the factory committed up to seq {chain.HeadSeq} ({chain.Runs} runs): runs were deleted from the end"));
        }

        return Result(null);
    }

    private static string? ColumnDifference(NpgsqlDataReader reader, RunRecord run)
    {
        static string? Nullable(NpgsqlDataReader r, int i) => r.IsDBNull(i) ? null : r.GetString(i);
        if (reader.GetGuid(1) != run.Id)
        {
            return "run_id";
        }

        if (reader.GetString(5) != run.Serial)
        {
            return "serial";
        }

        if (reader.GetString(6) != run.Verdict.ToWord())
        {
            return "verdict";
        }

        if (reader.GetInt64(7) != run.EndedUtc.UtcTicks)
        {
            return "ended_ticks";
        }

        if (reader.GetInt32(8) != run.Slot)
        {
            return "slot";
        }

        if (Nullable(reader, 9) != run.Lot)
        {
            return "lot";
        }

        if (reader.GetString(10) != run.Station)
        {
            return "station";
        }

        if (reader.GetInt32(11) != run.Readings.Count)
        {
            return "reading_count";
        }

        if (reader.GetString(12) != run.SequenceId || reader.GetInt32(13) != run.SequenceRevision)
        {
            return "sequence_id/sequence_revision";
        }

        if (Nullable(reader, 14) != run.Reason)
        {
            return "reason";
        }

        return Nullable(reader, 15) != run.FirstFailingReading ? "first_failing_reading" : null;
    }

    private static string? ReadingDifference(string? rows, RunRecord run)
    {
        using var document = JsonDocument.Parse(rows ?? "[]");
        var stored = document.RootElement;
        if (stored.GetArrayLength() != run.Readings.Count)
        {
            return $"{stored.GetArrayLength()} readings rows for {run.Readings.Count} readings";
        }

        for (var i = 0; i < run.Readings.Count; i++)
        {
            var row = stored[i];
            var reading = run.Readings[i];
            if (row[0].GetString() != reading.Name
                || !SameReal(row[1], reading.Value)
                || row[2].GetString() != reading.Unit
                || !SameReal(row[3], reading.Low)
                || !SameReal(row[4], reading.High)
                || row[5].GetString() != reading.Verdict.ToWord())
            {
                return $"reading {i} ({reading.Name}) differs from the stored run";
            }
        }

        return null;
    }

    private static bool SameReal(JsonElement element, double? value) =>
        FactoryCopy.Stored(value) is double d
            ? element.ValueKind == JsonValueKind.Number && element.GetDouble() == d
            : element.ValueKind == JsonValueKind.Null;
}
