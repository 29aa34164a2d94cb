using System.Net;
using System.Net.Http.Headers;
using LineTest.Core.Results;
using LineTest.Reports.Loading;
using LineTest.Storage.Sqlite;
using LineTest.TestSupport.Builders;
using LineTest.Web.Access;
using LineTest.Web.Data;
using LineTest.Web.Hosting;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Time.Testing;

namespace LineTest.Web.Tests.Support;

/// <summary>
/// The page on the ASP.NET Core test host over two invented stations' results folders, with a fixed clock
/// (2026-12-03 10:00 UTC, in the 06:00 shift). Requests can come from loopback or from another computer.
/// </summary>
internal sealed class PageHost : IAsyncDisposable
{
    public static readonly DateTimeOffset Now = new(2026, 12, 3, 10, 0, 0, TimeSpan.Zero);

    public const string Token = "correct-horse-battery-staple-7d3f";

    private PageHost(string root, WebApplication app, RecordingLoggerProvider log, QueryRecordingSource source, FakeTimeProvider clock)
    {
        Clock = clock;
        Root = root;
        App = app;
        Log = log;
        Source = source;
    }

    /// <summary>The page's clock, starting at <see cref="Now"/>.</summary>
    public FakeTimeProvider Clock { get; }

    /// <summary>The page's source, recording what the page loads.</summary>
    public QueryRecordingSource Source { get; }

    public string Root { get; }

    public WebApplication App { get; }

    public RecordingLoggerProvider Log { get; }

    public string StationA => Path.Combine(Root, "st01");

    public string StationB => Path.Combine(Root, "st02");

    /// <summary>ST-01: 20 units from 06:10, three failing verify.error and retested to pass, one error; ST-02: 5 units of lot L-B.</summary>
    public static async Task<PageHost> StartAsync(WebPageOptions? options = null, string listen = "127.0.0.1:0", NamedShifts? shifts = null)
    {
        var root = await WriteStationsAsync();
        return await StartAsync(root, new SqliteFolderSource([Path.Combine(root, "st01"), Path.Combine(root, "st02")]), options, listen, shifts);
    }

    /// <summary>A temporary folder with the two stations' results folders <c>st01</c> and <c>st02</c>.</summary>
    public static async Task<string> WriteStationsAsync()
    {
        var root = Directory.CreateTempSubdirectory("linetest-web-").FullName;
        await WriteAsync(Path.Combine(root, "st01"), StationARuns());
        await WriteAsync(Path.Combine(root, "st02"), StationBRuns());
        return root;
    }

    /// <summary>The page over <paramref name="inner"/> (e.g. the factory database); <paramref name="root"/> is deleted at the end.</summary>
    public static async Task<PageHost> StartAsync(
        string root, IResultsSource inner, WebPageOptions? options = null, string listen = "127.0.0.1:0", NamedShifts? shifts = null)
    {
        var log = new RecordingLoggerProvider();
        var loggers = LoggerFactory.Create(b => b.AddProvider(log).SetMinimumLevel(LogLevel.Information));
        var source = new QueryRecordingSource(inner);
        var clock = new FakeTimeProvider(Now);
        var setup = new WebPageSetup(ListenAddress.Parse(listen, out _)!, options ?? new WebPageOptions(), source)
        {
            Time = clock,
            Loggers = loggers,
            Shifts = shifts ?? NamedShifts.Default,
        };
        var app = WebPageApp.Create(setup, b => b.WebHost.UseTestServer());
        await app.StartAsync();
        return new PageHost(root, app, log, source, clock);
    }

    /// <summary>verify.error of unit <paramref name="i"/>: spread deterministically around 0.02 °C.</summary>
    public static double VerifyError(int i) => 0.02 + (0.03 * Math.Sin(i * 1.7)) + (0.01 * Math.Cos(i * 0.37));

    public static IReadOnlyList<RunRecord> StationARuns()
    {
        var runs = new List<RunRecord>();
        var start = new DateTimeOffset(2026, 12, 3, 6, 10, 0, TimeSpan.Zero);
        for (var i = 1; i <= 20; i++)
        {
            var serial = $"CTP40A-2612-{i:D6}";
            var at = start.AddMinutes(11 * i);
            var builder = new RunRecordBuilder().WithSerial(serial).WithStation("ST-01").WithLot("L-A").WithSlot(((i - 1) % 4) + 1)
                .StartedAt(at, TimeSpan.FromMinutes(10)).WithReadings(Readings(VerifyError(i), at));
            if (i % 7 == 0)
            {
                runs.Add(new RunRecordBuilder().WithSerial(serial).WithStation("ST-01").WithLot("L-A").WithSlot(1)
                    .StartedAt(at.AddMinutes(-5), TimeSpan.FromMinutes(4)).WithReadings(Readings(0.4, at)).Failing("verify.error", "verify.error 0.4 degC above 0.25").Build());
            }

            runs.Add(i == 11 ? builder.Erroring("unit not answering").Build() : builder.Build());
        }

        return runs;
    }

    public static IReadOnlyList<RunRecord> StationBRuns() =>
        [.. Enumerable.Range(1, 5).Select(i => new RunRecordBuilder().WithSerial($"CTP40A-2612-1000{i:D2}").WithStation("ST-02").WithLot("L-B")
            .StartedAt(new DateTimeOffset(2026, 12, 3, 7, 0, 0, TimeSpan.Zero).AddMinutes(15 * i)).WithReadings(Readings(0.01 * i, Now)).Build())];

    public static Reading[] Readings(double verifyError, DateTimeOffset at) =>
    [
        new("supply.current", 4.2 + (verifyError / 10), "mA", 3.5, 5.0, Verdict.Pass) { Step = "power-on", At = at },
        new("verify.error", verifyError, "degC", -0.25, 0.25, verifyError is > -0.25 and < 0.25 ? Verdict.Pass : Verdict.Fail)
        {
            Step = "verify", Setpoint = "check", ExpandedUncertainty = 0.05, CoverageFactor = 2, DecisionRule = "guarded",
            AcceptanceLow = -0.2, AcceptanceHigh = 0.2, At = at,
        },
    ];

    public static async Task WriteAsync(string folder, IEnumerable<RunRecord> runs)
    {
        Directory.CreateDirectory(folder);
        await using var store = SqliteResultStore.Open(folder);
        foreach (var run in runs)
        {
            await store.AppendAsync(run, CancellationToken.None);
        }
    }

    /// <summary>A GET (or other method) as if from <paramref name="remote"/>, with an optional Authorization header.</summary>
    public async Task<(HttpStatusCode Status, string Body, IHeaderDictionary Headers)> SendAsync(
        string pathAndQuery, string remote = "127.0.0.1", AuthenticationHeaderValue? authorization = null, string method = "GET")
    {
        var server = App.GetTestServer();
        var context = await server.SendAsync(c =>
        {
            c.Request.Method = method;
            var q = pathAndQuery.IndexOf('?', StringComparison.Ordinal);
            c.Request.Path = q < 0 ? pathAndQuery : pathAndQuery[..q];
            c.Request.QueryString = q < 0 ? QueryString.Empty : new QueryString(pathAndQuery[q..]);
            c.Connection.RemoteIpAddress = IPAddress.Parse(remote);
            if (authorization is not null)
            {
                c.Request.Headers.Authorization = authorization.ToString();
            }
        });
        using var reader = new StreamReader(context.Response.Body);
        return ((HttpStatusCode)context.Response.StatusCode, await reader.ReadToEndAsync(), context.Response.Headers);
    }

    public async ValueTask DisposeAsync()
    {
        await App.StopAsync();
        await App.DisposeAsync();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        try
        {
            Directory.Delete(Root, recursive: true);
        }
        catch (IOException)
        {
            // A temporary folder left behind is harmless.
        }
    }
}
