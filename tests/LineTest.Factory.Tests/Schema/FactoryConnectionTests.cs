using LineTest.Factory.Schema;

namespace LineTest.Factory.Tests.Schema;

public sealed class FactoryConnectionTests
{
    [Fact]
    public async Task Describe_NamesHostPortAndDatabaseWithoutThePassword()
    {
        await using var dataSource = FactoryConnection.Create("Host=db.example;Port=5433;Username=lt;Password=secret;Database=factory");
        Assert.Equal("postgresql://db.example:5433/factory", FactoryConnection.Describe(dataSource));
    }
}
