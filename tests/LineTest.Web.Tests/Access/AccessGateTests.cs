using System.Net;
using System.Net.Http.Headers;
using System.Text;
using LineTest.Web.Access;
using LineTest.Web.Hosting;
using LineTest.Web.Tests.Support;

namespace LineTest.Web.Tests.Access;

/// <summary>Requests from another computer to a page that listens beyond loopback with a token and a user configured.</summary>
public sealed class AccessGateTests : IAsyncLifetime
{
    private PageHost _host = null!;

    public async Task InitializeAsync() => _host = await PageHost.StartAsync(
        new WebPageOptions
        {
            TokenSha256 = SecretHash.Sha256Hex(PageHost.Token),
            User = "qe-hall2",
            PasswordHash = SecretHash.HashPassword("block-at-40", iterations: 1000),
        },
        listen: "0.0.0.0:0");

    public async Task DisposeAsync() => await _host.DisposeAsync();

    [Theory]
    [InlineData("/")]
    [InlineData("/units/CTP40A-2612-000007")]
    [InlineData("/assets/site.css")]
    [InlineData("/line/events")]
    public async Task Request_FromAnotherComputerWithoutToken_Refused401AndLogged(string path)
    {
        var (status, body, headers) = await _host.SendAsync(path, remote: "192.168.10.23");

        Assert.Equal(HttpStatusCode.Unauthorized, status);
        Assert.DoesNotContain("CTP40A", body, StringComparison.Ordinal);
        Assert.StartsWith("Basic", headers.WWWAuthenticate.ToString(), StringComparison.Ordinal);
        Assert.Contains(_host.Log.Messages, m => m.EventId == 4001 && m.Message.Contains("192.168.10.23", StringComparison.Ordinal) && m.Message.Contains("no credential", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Request_WrongToken_Refused401()
    {
        var (status, _, _) = await _host.SendAsync("/", remote: "192.168.10.23", authorization: new AuthenticationHeaderValue("Bearer", "guess"));

        Assert.Equal(HttpStatusCode.Unauthorized, status);
        Assert.Contains(_host.Log.Messages, m => m.EventId == 4001 && m.Message.Contains("wrong credential", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Request_BearerToken_ServedAndLoggedWithWhatWasViewed()
    {
        var (status, body, _) = await _host.SendAsync("/units/CTP40A-2612-000007", remote: "192.168.10.23", authorization: new AuthenticationHeaderValue("Bearer", PageHost.Token));

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains("CTP40A-2612-000007", body, StringComparison.Ordinal);
        Assert.Contains(_host.Log.Messages, m => m.EventId == 4000 && m.Message == "Page /units/CTP40A-2612-000007 viewed by token from 192.168.10.23");
    }

    [Fact]
    public async Task Request_UserAndPassword_ServedAndLoggedByName()
    {
        var basic = Convert.ToBase64String(Encoding.UTF8.GetBytes("qe-hall2:block-at-40"));
        var (status, _, _) = await _host.SendAsync("/yield?lot=L-A", remote: "10.0.0.7", authorization: new AuthenticationHeaderValue("Basic", basic));

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains(_host.Log.Messages, m => m.EventId == 4000 && m.Message == "Page /yield?lot=L-A viewed by qe-hall2 from 10.0.0.7");
    }

    [Fact]
    public async Task Request_UserWithWrongPassword_Refused401()
    {
        var basic = Convert.ToBase64String(Encoding.UTF8.GetBytes("qe-hall2:block-at-41"));
        var (status, _, _) = await _host.SendAsync("/", remote: "10.0.0.7", authorization: new AuthenticationHeaderValue("Basic", basic));

        Assert.Equal(HttpStatusCode.Unauthorized, status);
    }

    [Fact]
    public async Task Request_FromLoopback_ServedWithoutCredential()
    {
        var (status, _, _) = await _host.SendAsync("/", remote: "127.0.0.1");

        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Contains(_host.Log.Messages, m => m.EventId == 4000 && m.Message == "Page / viewed by this computer from 127.0.0.1");
    }
}
