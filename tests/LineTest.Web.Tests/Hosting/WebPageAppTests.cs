using System.Net;
using System.Net.Sockets;
using LineTest.Web.Access;
using LineTest.Web.Hosting;

namespace LineTest.Web.Tests.Hosting;

public sealed class WebPageAppTests
{
    [Fact]
    public void CannotListen_PortHeldByAnotherListener_SaysWhy()
    {
        using var holder = new TcpListener(IPAddress.Loopback, 0);
        holder.Start();
        var port = ((IPEndPoint)holder.LocalEndpoint).Port;

        var reason = WebPageApp.CannotListen(new ListenAddress(IPAddress.Loopback, port));

        Assert.NotNull(reason);
        Assert.Contains("in use", reason, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public void CannotListen_AnyFreePort_Null()
    {
        var address = new ListenAddress(IPAddress.Loopback, 0);

        Assert.Null(WebPageApp.CannotListen(address));
    }
}
