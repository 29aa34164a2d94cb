namespace LineTest.Storage.Sqlite;

/// <summary>A product and a sequence id that tested it, with the number of stored runs.</summary>
/// <param name="Product">Product name from the sequence, e.g. CTP-40A.</param>
/// <param name="SequenceId">Sequence id.</param>
/// <param name="Runs">Stored runs of that pair.</param>
public sealed record ProductSequence(string Product, string SequenceId, long Runs);
