using LineTest.Factory.Forwarding;

namespace LineTest.Web.Tests.Support;

/// <summary>A station's forwarding backlog set by the test.</summary>
internal sealed class FixedBacklog(FactoryBacklogStatus current) : IFactoryBacklog
{
    public FactoryBacklogStatus Current { get; set; } = current;
}
