using System.Net;
using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Access;

/// <summary>
/// Every request passes here first: only GET and HEAD (the page is read-only); loopback requests are let through,
/// any other needs the credential; every page looked at is logged with who and from where. Responses forbid
/// content from any other host (Content-Security-Policy).
/// </summary>
internal sealed class AccessGate
{
    private const string Policy =
        "default-src 'self'; img-src 'self'; style-src 'self'; script-src 'self'; connect-src 'self'; font-src 'self'; form-action 'self'; frame-ancestors 'none'; base-uri 'none'";

    private readonly RequestDelegate _next;
    private readonly WebCredentials _credentials;
    private readonly ILogger<AccessGate> _logger;

    public AccessGate(RequestDelegate next, WebCredentials credentials, ILogger<AccessGate> logger)
    {
        _next = next;
        _credentials = credentials;
        _logger = logger;
    }

    public async Task InvokeAsync(HttpContext context)
    {
        var request = context.Request;
        var path = request.Path.Value + request.QueryString.Value;
        var remoteAddress = context.Connection.RemoteIpAddress;
        var remote = remoteAddress?.ToString() ?? "unknown";

        // An unknown address is not trusted: only a connection known to come from this computer skips the credential.
        string? who = remoteAddress is not null && IPAddress.IsLoopback(remoteAddress) ? "this computer" : _credentials.Authenticate(request);
        if (who is null)
        {
            AccessLog.Refused(_logger, path, remote, request.Headers.Authorization.Count == 0 ? "no credential" : "wrong credential");
            context.Response.StatusCode = StatusCodes.Status401Unauthorized;
            context.Response.Headers.WWWAuthenticate = "Basic realm=\"LineTest\", charset=\"UTF-8\"";
            context.Response.ContentType = "text/plain; charset=utf-8";
            await context.Response.WriteAsync("A credential is needed to look at this page from another computer.\n", context.RequestAborted).ConfigureAwait(false);
            return;
        }

        if (!HttpMethods.IsGet(request.Method) && !HttpMethods.IsHead(request.Method))
        {
            AccessLog.Refused(_logger, path, remote, request.Method + " on a read-only page");
            context.Response.StatusCode = StatusCodes.Status405MethodNotAllowed;
            context.Response.Headers.Allow = "GET, HEAD";
            return;
        }

        if (!request.Path.StartsWithSegments("/assets", StringComparison.Ordinal))
        {
            AccessLog.Viewed(_logger, path, who, remote);
        }

        var headers = context.Response.Headers;
        headers.ContentSecurityPolicy = Policy;
        headers.XContentTypeOptions = "nosniff";
        headers["Referrer-Policy"] = "no-referrer";
        await _next(context).ConfigureAwait(false);
    }
}
