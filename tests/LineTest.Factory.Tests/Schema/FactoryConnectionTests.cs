using LineTest.Factory.Schema;
using Npgsql;

namespace LineTest.Factory.Tests.Schema;

public sealed class FactoryConnectionTests
{
    [Fact]
    public async Task Create_NoReadBufferSizeGiven_TheLargerDefault()
    {
        await using var dataSource = FactoryConnection.Create("Host=127.0.0.1;Port=5432;Username=postgres;Database=factory");
        Assert.Equal(FactoryConnection.DefaultReadBufferSize, new NpgsqlConnectionStringBuilder(dataSource.ConnectionString).ReadBufferSize);
    }

    [Theory]
    [InlineData("Read Buffer Size")]
    [InlineData("readbuffersize")]
    public async Task Create_ReadBufferSizeGiven_KeptAsGiven(string keyword)
    {
        await using var dataSource = FactoryConnection.Create($"Host=127.0.0.1;Port=5432;Username=postgres;Database=factory;{keyword}=16384");
        Assert.Equal(16384, new NpgsqlConnectionStringBuilder(dataSource.ConnectionString).ReadBufferSize);
    }

    [Fact]
    public async Task Describe_NamesHostPortAndDatabaseWithoutThePassword()
    {
        await using var dataSource = FactoryConnection.Create("Host=db.example;Port=5433;Username=lt;Password=secret;Database=factory");
        Assert.Equal("postgresql://db.example:5433/factory", FactoryConnection.Describe(dataSource));
    }
}
