namespace LineTest.Factory.Reporting;

/// <summary>
/// What the factory database holds of one station, for the live page's tile. The server sees only what arrived: runs a
/// station has stored but not sent yet are counted on the station (its outbox), not here.
/// </summary>
/// <param name="Station">Station id.</param>
/// <param name="Chains">Station databases (hash chains) the station has forwarded from; more than one after a database was replaced.</param>
/// <param name="RunsHeld">Runs committed from the station, over all its chains.</param>
/// <param name="HeadSeq">The station's seq the factory has committed through, in the chain that received a run last.</param>
/// <param name="LastReceivedUtc">When the server last committed a batch of the station (the server's clock).</param>
/// <param name="LastEndedUtc">When the run at <paramref name="HeadSeq"/> ended (the station's clock); null when it cannot be found.</param>
/// <param name="Refused">Runs of the station refused at the door and raised as alarms.</param>
public sealed record FactoryStationHead(
    string Station, int Chains, long RunsHeld, long HeadSeq, DateTimeOffset LastReceivedUtc, DateTimeOffset? LastEndedUtc, long Refused);
