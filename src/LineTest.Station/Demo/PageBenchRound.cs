namespace LineTest.Station.Demo;

/// <summary>One shift of the page benchmark.</summary>
/// <param name="Round">1-based position in the order the shifts ran.</param>
/// <param name="PageOpen">True when the page was served in the same process and polled during the shift.</param>
/// <param name="Shift">The shift's figures (wall, and CPU of the whole process: the page's own work included).</param>
/// <param name="Requests">Page requests answered during the shift (line, yield, history), events streams not counted.</param>
/// <param name="Events">Live events received on the open line page during the shift.</param>
public sealed record PageBenchRound(int Round, bool PageOpen, EngineFigures Shift, int Requests, int Events);
