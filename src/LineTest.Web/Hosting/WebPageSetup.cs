using LineTest.Reports.Loading;
using LineTest.Web.Access;
using LineTest.Web.Data;
using Microsoft.Extensions.Logging;

namespace LineTest.Web.Hosting;

/// <summary>Everything the page needs to start: where it listens, its settings, what it reads, its clock and loggers.</summary>
/// <param name="Listen">Where to listen.</param>
/// <param name="Options">The <c>Station:Web</c> settings.</param>
/// <param name="Source">Where the runs are read.</param>
public sealed record WebPageSetup(ListenAddress Listen, WebPageOptions Options, IResultsSource Source)
{
    /// <summary>The clock for shifts, days and "updated at". Default: the system clock.</summary>
    public TimeProvider Time { get; init; } = TimeProvider.System;

    /// <summary>The factory's shifts (<c>Station:Shifts</c>, read by <see cref="ShiftSettings.Read"/>). Default: 06:00, 14:00, 22:00 UTC.</summary>
    public NamedShifts Shifts { get; init; } = NamedShifts.Default;

    /// <summary>The loggers (Serilog's in the station); null keeps ASP.NET Core's console logging.</summary>
    public ILoggerFactory? Loggers { get; init; }

    /// <summary>Every reason the page must not start (bad settings, another computer allowed without a credential).</summary>
    public IReadOnlyList<string> Check() => Options.Validate(Listen);
}
