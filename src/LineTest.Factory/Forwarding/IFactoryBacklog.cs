namespace LineTest.Factory.Forwarding;

/// <summary>What the station has not yet handed to the factory database, for the screen and the log.</summary>
public interface IFactoryBacklog
{
    /// <summary>The latest known state (updated after every pass and every failed attempt).</summary>
    FactoryBacklogStatus Current { get; }
}
