namespace LineTest.Reports.Fuzzing;

/// <summary>The figures of a fuzz run over report inputs.</summary>
/// <param name="Kind">"csv" or "database".</param>
/// <param name="Inputs">Mutated inputs tried.</param>
/// <param name="Reported">Inputs that gave a report.</param>
/// <param name="Refused">Inputs refused with a reason.</param>
/// <param name="Crashed">Inputs that threw an unexpected exception.</param>
/// <param name="OverTenSeconds">Inputs that took more than 10 s.</param>
/// <param name="SlowestSeconds">The slowest input, seconds.</param>
/// <param name="FirstCrash">The first crash's exception type and message, or null.</param>
/// <param name="SlowestCpuSeconds">
/// The most processor time the process spent during one input, seconds: the input's own work on one worker, an upper
/// bound with several (the others' work is counted too). On a loaded machine it tells work from waiting.
/// </param>
public sealed record FuzzSummary(string Kind, int Inputs, int Reported, int Refused, int Crashed, int OverTenSeconds, double SlowestSeconds, string? FirstCrash, double SlowestCpuSeconds = 0);
