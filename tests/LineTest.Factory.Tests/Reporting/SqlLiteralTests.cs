using LineTest.Factory.Reporting;
using LineTest.Factory.Tests.Support;
using Npgsql;
using NpgsqlTypes;

namespace LineTest.Factory.Tests.Reporting;

public sealed class SqlLiteralTests
{
    public static TheoryData<string> Texts => new()
    {
        string.Empty,
        "ST-01",
        "O'Brien's lot",
        @"C:\lots\new",
        @"\' OR 1=1 --",
        "''''",
        @"\\\",
        "line\nbreak\ttab",
        "µV °C Ω 温度 😀",
        "$$ dollar $tag$",
    };

    [PostgresTheory]
    [MemberData(nameof(Texts))]
    public async Task Of_Text_ReadBackUnchangedWhateverStandardConformingStrings(string text)
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        foreach (var setting in new[] { "on", "off" })
        {
            await using (var set = new NpgsqlCommand($"SET standard_conforming_strings = {setting};", connection))
            {
                await set.ExecuteNonQueryAsync();
            }

            await using var command = new NpgsqlCommand($"SELECT {SqlLiteral.Of(NpgsqlDbType.Text, text)};", connection);
            Assert.Equal(text, (string)(await command.ExecuteScalarAsync())!);
        }
    }

    [PostgresFact]
    public async Task Of_NumbersTimesAndArrays_ReadBackUnchanged()
    {
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        var instant = new DateTime(2026, 12, 3, 13, 45, 7, DateTimeKind.Utc).AddTicks(1234560);
        await using var command = new NpgsqlCommand(
            $"""
            SELECT {SqlLiteral.Of(NpgsqlDbType.Bigint, long.MinValue)}, {SqlLiteral.Of(NpgsqlDbType.Integer, int.MaxValue)},
                   {SqlLiteral.Of(NpgsqlDbType.TimestampTz, instant)}, {SqlLiteral.Of(NpgsqlDbType.Array | NpgsqlDbType.Text, new[] { "a'b", @"c\d" })};
            """,
            connection);
        await using var reader = await command.ExecuteReaderAsync();
        Assert.True(await reader.ReadAsync());
        Assert.Equal(long.MinValue, reader.GetInt64(0));
        Assert.Equal(int.MaxValue, reader.GetInt32(1));
        Assert.Equal(instant, reader.GetFieldValue<DateTime>(2));
        Assert.Equal(["a'b", @"c\d"], reader.GetFieldValue<string[]>(3));
    }

    [PostgresFact]
    public async Task Of_MostNegativeBigint_ReadAsOneLiteralNotAnOverflowingNegation()
    {
        // Unquoted, -9223372036854775808::bigint is the negation of 9223372036854775808::bigint, which overflows.
        await using var database = await TestDatabase.CreateAsync();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using var command = new NpgsqlCommand($"SELECT {SqlLiteral.Of(NpgsqlDbType.Bigint, long.MinValue)} < {SqlLiteral.Of(NpgsqlDbType.Integer, int.MinValue)};", connection);
        Assert.True((bool)(await command.ExecuteScalarAsync())!);
    }

    [Fact]
    public void Of_TextWithNul_ThrowsSayingWhy()
    {
        var ex = Assert.Throws<ArgumentException>(() => SqlLiteral.Of(NpgsqlDbType.Text, "a\0b"));
        Assert.Contains("NUL", ex.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Of_LocalTime_Throws()
    {
        Assert.Throws<ArgumentException>(() => SqlLiteral.Of(NpgsqlDbType.TimestampTz, new DateTime(2026, 1, 1, 0, 0, 0, DateTimeKind.Local)));
    }
}
