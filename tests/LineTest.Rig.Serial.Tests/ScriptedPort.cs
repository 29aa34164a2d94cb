using LineTest.Core.Fixtures;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.Twins;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests;

/// <summary>A scripted instrument on a pseudo-terminal and a serial line to it; disposes the line before the server.</summary>
internal sealed class ScriptedPort : IDisposable
{
    private readonly PortFolder _folder = new();

    public ScriptedPort(Func<string, TwinReply> handler, ILineFraming? framing = null, int timeoutMs = 2000, int retries = 1, string name = "source")
    {
        framing ??= PlainFraming.Instance;
        Server = new LineServer("scripted", _folder.Port("tty"), framing, handler, NullLogger.Instance);
        Line = new SerialLine(name, new PortDefinition { Name = Server.PortName, TimeoutMs = timeoutMs, Retries = retries }, framing, NullLogger.Instance, TimeProvider.System);
    }

    public LineServer Server { get; }

    public SerialLine Line { get; }

    public void Dispose()
    {
        Line.Dispose();
        Server.Dispose();
        _folder.Dispose();
    }
}
