using LineTest.Station.Composition;

namespace LineTest.Station.Hosting;

/// <summary>What the hosted station reads and writes besides its logger.</summary>
public sealed record StationServiceContext(string Root, StationOptions Options, TextReader Input, TextWriter Output, TextWriter Error);
