using System.Net;
using LineTest.Web.Access;

namespace LineTest.Web.Tests.Access;

public sealed class ListenAddressTests
{
    [Theory]
    [InlineData("127.0.0.1:5080", "127.0.0.1", 5080, true)]
    [InlineData("localhost:8080", "127.0.0.1", 8080, true)]
    [InlineData("[::1]:5080", "::1", 5080, true)]
    [InlineData("0.0.0.0:5080", "0.0.0.0", 5080, false)]
    [InlineData("192.168.10.5:80", "192.168.10.5", 80, false)]
    public void Parse_Good_AddressPortAndLoopback(string text, string address, int port, bool loopback)
    {
        var parsed = ListenAddress.Parse(text, out var error);

        Assert.Null(error);
        Assert.NotNull(parsed);
        Assert.Equal(IPAddress.Parse(address), parsed.Address);
        Assert.Equal(port, parsed.Port);
        Assert.Equal(loopback, parsed.IsLoopback);
    }

    [Theory]
    [InlineData("5080", "is not ADDR:PORT")]
    [InlineData("127.0.0.1:", "is not ADDR:PORT")]
    [InlineData("127.0.0.1:99999", "the port '99999' is not a number from 0 to 65535")]
    [InlineData("station-7:5080", "'station-7' is not an IP address")]
    public void Parse_Bad_SaysWhy(string text, string reason)
    {
        Assert.Null(ListenAddress.Parse(text, out var error));
        Assert.Contains(reason, error, StringComparison.Ordinal);
    }
}
