using LineTest.Core.Results;
using LineTest.Storage.Sqlite;

namespace LineTest.Factory.Forwarding;

/// <summary>A run that passed the door checks, with its parsed record.</summary>
/// <param name="Stored">What the station stored.</param>
/// <param name="Run">Its parsed record.</param>
internal sealed record AcceptedRun(OutboxRun Stored, RunRecord Run);
