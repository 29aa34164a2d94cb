namespace LineTest.Station.Demo;

/// <summary>What a simulated shift costs the PC running it.</summary>
/// <param name="Units">Units in the shift.</param>
/// <param name="SimulatedSeconds">Simulated time of the shift.</param>
/// <param name="WallSeconds">Wall time of the shift.</param>
/// <param name="CpuSeconds">Processor time the process used during the shift (all threads).</param>
/// <param name="PeakWorkingSetBytes">The process's peak working set after the shift (includes start-up).</param>
/// <param name="AllocatedBytes">Bytes allocated on the managed heap during the shift.</param>
/// <param name="Gen2Collections">Full collections during the shift.</param>
/// <param name="StoredRuns">
/// True when every run was written to a results database (a temporary one, deleted afterwards, synchronous=FULL: one
/// flush per run) and logged; false for the engine alone (runs discarded, no logging).
/// </param>
public sealed record EngineFigures(int Units, double SimulatedSeconds, double WallSeconds, double CpuSeconds, long PeakWorkingSetBytes, long AllocatedBytes, int Gen2Collections, bool StoredRuns);
