using LineTest.Web.Hosting;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;

namespace LineTest.Web.Tests.Hosting;

public sealed class StationWebPageExtensionsTests
{
    [Fact]
    public void AddStationWebPage_NoListen_RegistersNothing()
    {
        var services = new ServiceCollection();

        Assert.False(services.AddStationWebPage(Config([]), "results"));
        Assert.DoesNotContain(services, s => s.ServiceType == typeof(IHostedService));
    }

    [Fact]
    public void AddStationWebPage_Listen_RegistersTheHostedPage()
    {
        var services = new ServiceCollection();

        Assert.True(services.AddStationWebPage(Config(new() { ["Station:Web:Listen"] = "127.0.0.1:5080" }), "results"));
        Assert.Contains(services, s => s.ServiceType == typeof(IHostedService));
    }

    [Fact]
    public void AddStationWebPage_NonLoopbackWithoutCredential_RefusesBeforeTheStationStarts()
    {
        var services = new ServiceCollection();

        var ex = Assert.Throws<InvalidOperationException>(() => services.AddStationWebPage(Config(new() { ["Station:Web:Listen"] = "0.0.0.0:5080" }), "results"));
        Assert.Contains("a credential is needed", ex.Message, StringComparison.Ordinal);
    }

    private static IConfiguration Config(Dictionary<string, string?> values) => new ConfigurationBuilder().AddInMemoryCollection(values).Build();
}
