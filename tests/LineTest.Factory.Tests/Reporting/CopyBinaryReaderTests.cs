using LineTest.Factory.Reporting;
using LineTest.Factory.Tests.Support;
using Npgsql;

namespace LineTest.Factory.Tests.Reporting;

public sealed class CopyBinaryReaderTests
{
    private const string Columns = "id, n, k, t, v, b";

    // Awkward values of every type the reports read: NULLs, non-finite and signed-zero doubles, the extremes of the
    // integers, empty and non-ASCII texts, and a text longer than the reader's 64 KiB buffer.
    private const string Fill = """
        CREATE TEMP TABLE copy_cases (row_no serial, id uuid NOT NULL, n bigint, k integer, t text, v double precision, b boolean);
        INSERT INTO copy_cases (id, n, k, t, v, b)
        SELECT md5(i::text)::uuid,
               CASE i % 5 WHEN 0 THEN NULL WHEN 1 THEN -9223372036854775808 WHEN 2 THEN 9223372036854775807 ELSE i * 7919 END,
               CASE i % 4 WHEN 0 THEN NULL WHEN 1 THEN -2147483648 WHEN 2 THEN 2147483647 ELSE -i END,
               CASE i % 7 WHEN 0 THEN NULL WHEN 1 THEN '' WHEN 2 THEN 'ST-0' || (i % 3) WHEN 3 THEN 'Grad °C, µV, Ω – ' || i
                          WHEN 4 THEN E'quote '' backslash \\ tab \t' WHEN 5 THEN repeat('x', 70000 + i % 3) ELSE 'verify.error' END,
               CASE i % 9 WHEN 0 THEN NULL WHEN 1 THEN 'NaN' WHEN 2 THEN 'Infinity' WHEN 3 THEN '-Infinity' WHEN 4 THEN '-0'
                          WHEN 5 THEN 1.7976931348623157e308 WHEN 6 THEN 4.9e-324 ELSE i / 3.0 END,
               CASE i % 3 WHEN 0 THEN NULL ELSE i % 2 = 0 END
          FROM generate_series(1, 20000) i;
        """;

    [PostgresFact]
    public async Task NextRowAsync_EveryTypeAndNull_SameValuesAsTheDataReader()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await ExecuteAsync(connection, Fill);

        var expected = new List<(Guid, long?, int?, string?, double?, bool?)>();
        await using (var command = new NpgsqlCommand($"SELECT {Columns} FROM copy_cases ORDER BY row_no;", connection))
        await using (var reader = await command.ExecuteReaderAsync())
        {
            while (await reader.ReadAsync())
            {
                expected.Add((
                    reader.GetGuid(0),
                    reader.IsDBNull(1) ? null : reader.GetInt64(1),
                    reader.IsDBNull(2) ? null : reader.GetInt32(2),
                    reader.IsDBNull(3) ? null : reader.GetString(3),
                    reader.IsDBNull(4) ? null : reader.GetDouble(4),
                    reader.IsDBNull(5) ? null : reader.GetBoolean(5)));
            }
        }

        var actual = new List<(Guid, long?, int?, string?, double?, bool?)>();
        var cache = new CopyTextCache();
        await using (var copy = await CopyBinaryReader.StartAsync(connection, $"COPY (SELECT {Columns} FROM copy_cases ORDER BY row_no) TO STDOUT (FORMAT BINARY)", 6, CancellationToken.None))
        {
            while (await copy.NextRowAsync(CancellationToken.None))
            {
                var id = copy.ReadGuid();
                var n = copy.TryReadText(out var nBytes) ? System.Buffers.Binary.BinaryPrimitives.ReadInt64BigEndian(nBytes) : (long?)null;
                var k = copy.TryReadText(out var kBytes) ? System.Buffers.Binary.BinaryPrimitives.ReadInt32BigEndian(kBytes) : (int?)null;
                var t = copy.ReadText(cache);
                var v = copy.ReadNullableDouble();
                var b = copy.TryReadText(out var bBytes) ? bBytes[0] != 0 : (bool?)null;
                actual.Add((id, n, k, t, v, b));
            }
        }

        Assert.Equal(expected.Count, actual.Count);
        for (var i = 0; i < expected.Count; i++)
        {
            // Doubles compared by their bits: NaN equals NaN, and −0 is not +0.
            var (e, a) = (expected[i], actual[i]);
            Assert.True(
                e.Item1 == a.Item1 && e.Item2 == a.Item2 && e.Item3 == a.Item3 && e.Item4 == a.Item4 && e.Item6 == a.Item6
                && e.Item5.HasValue == a.Item5.HasValue && BitConverter.DoubleToInt64Bits(e.Item5 ?? 0) == BitConverter.DoubleToInt64Bits(a.Item5 ?? 0),
                $"row {i + 1}: data reader {e}, COPY {a}");
        }

        Assert.Equal(20000, actual.Count);
    }

    [PostgresFact]
    public async Task NextRowAsync_RowsReadOnlyInPart_TheNextRowStartsRight()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await ExecuteAsync(connection, Fill);
        var copy = await CopyBinaryReader.StartAsync(connection, "COPY (SELECT row_no, t FROM copy_cases ORDER BY row_no) TO STDOUT (FORMAT BINARY)", 2, CancellationToken.None);
        var rows = 0;
        while (await copy.NextRowAsync(CancellationToken.None))
        {
            rows++;

            // Every other row is left after its first field.
            Assert.Equal(rows, copy.ReadInt32());
            if (rows % 2 == 0)
            {
                copy.ReadText();
            }
        }

        Assert.Equal(20000, rows);
        Assert.False(await copy.NextRowAsync(CancellationToken.None));

        // Closed after its end, the COPY leaves the connection free for the next statement.
        await copy.DisposeAsync();
        await using var after = new NpgsqlCommand("SELECT 1;", connection);
        Assert.Equal(1, await after.ExecuteScalarAsync());
    }

    [PostgresFact]
    public async Task ReadGuid_OnAnIntegerField_ThrowsNamingRowAndField()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using var copy = await CopyBinaryReader.StartAsync(connection, "COPY (SELECT 1::integer, 2::integer) TO STDOUT (FORMAT BINARY)", 2, CancellationToken.None);
        Assert.True(await copy.NextRowAsync(CancellationToken.None));
        copy.ReadInt32();
        var ex = Assert.Throws<InvalidDataException>(() => copy.ReadGuid());
        Assert.Contains("row 1, field 1", ex.Message, StringComparison.Ordinal);
    }

    [PostgresFact]
    public async Task NextRowAsync_RowsWithAnotherFieldCount_ThrowsSayingSo()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using var copy = await CopyBinaryReader.StartAsync(connection, "COPY (SELECT 1, 2, 3) TO STDOUT (FORMAT BINARY)", 2, CancellationToken.None);
        var ex = await Assert.ThrowsAsync<InvalidDataException>(async () => await copy.NextRowAsync(CancellationToken.None));
        Assert.Contains("3 fields; 2 were expected", ex.Message, StringComparison.Ordinal);
    }

    private static async Task ExecuteAsync(NpgsqlConnection connection, string sql)
    {
        await using var command = new NpgsqlCommand(sql, connection);
        await command.ExecuteNonQueryAsync();
    }
}
