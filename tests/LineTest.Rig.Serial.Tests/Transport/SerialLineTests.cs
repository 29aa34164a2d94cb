using LineTest.Core.Fixtures;
using LineTest.Rig.Instruments;
using LineTest.Rig.Serial.Transport;
using LineTest.Rig.Serial.Twins;
using Microsoft.Extensions.Logging.Abstractions;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class SerialLineTests : IDisposable
{
    private readonly PortFolder _folder = new();
    private readonly List<IDisposable> _owned = [];

    [LinuxFact]
    public async Task QueryAsync_Answer_ReturnsParsedReplyAndSendsExactBytes()
    {
        var (server, line) = Pair(cmd => TwinReply.Answer(cmd == "PING?" ? "PONG" : "?"));

        var reply = await line.QueryAsync("PING?", ReplyParse<string>.Ok, default);

        Assert.Equal("PONG", reply);
        Assert.Equal(["PING?"], server.Received);
    }

    [LinuxFact]
    public async Task QueryAsync_Silent_RetriesThenNoAnswerNamingPortTimeoutAndCommand()
    {
        var (server, line) = Pair(_ => TwinReply.Silence, retries: 2, timeoutMs: 100);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync("SOUR:TEMP?", ReplyParse<string>.Ok, default));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
        Assert.StartsWith($"source on {server.PortName}: no answer within 100 ms to 'SOUR:TEMP?'", fault.Message, StringComparison.Ordinal);
        Assert.Contains("3 attempts", fault.Message, StringComparison.Ordinal);
        Assert.Equal(["SOUR:TEMP?", "SOUR:TEMP?", "SOUR:TEMP?"], server.Received);
    }

    [LinuxFact]
    public async Task CommandAsync_Silent_IsNeverRetried()
    {
        var (server, line) = Pair(_ => TwinReply.Silence, retries: 2, timeoutMs: 100);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.CommandAsync("SOUR:SETP 50", ReplyParse<string>.Ok, default));

        Assert.Equal(InstrumentFaultKind.NoAnswer, fault.Kind);
        Assert.Equal(["SOUR:SETP 50"], server.Received);
    }

    [LinuxFact]
    public async Task QueryAsync_GarbageOnce_RetriesAndSucceeds()
    {
        var calls = 0;
        var (server, line) = Pair(_ => Interlocked.Increment(ref calls) == 1 ? TwinReply.Raw([0x00, 0xFF, 0x13, (byte)'\n']) : TwinReply.Answer("42"));

        var reply = await line.QueryAsync("X?", ReplyParse<string>.Ok, default);

        Assert.Equal("42", reply);
        Assert.Equal(2, server.Received.Count);
    }

    public static TheoryData<byte[], string> GarbageReplies => new()
    {
        { [(byte)'4', 0x00, (byte)'2', (byte)'\n'], "non-printable byte 0x00" },
        { [.. Enumerable.Repeat((byte)'9', 300), (byte)'\n'], "longer than 256 characters" },
        { "12.5"u8.ToArray(), "no line end within 100 ms" },
    };

    [LinuxTheory]
    [MemberData(nameof(GarbageReplies))]
    public async Task QueryAsync_BadFraming_GarbageReply(byte[] bytes, string expected)
    {
        var (_, line) = Pair(_ => TwinReply.Raw(bytes), retries: 0, timeoutMs: 100);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync("X?", ReplyParse<string>.Ok, default));

        Assert.Equal(InstrumentFaultKind.GarbageReply, fault.Kind);
        Assert.Contains(expected, fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task QueryAsync_ChecksumWrong_GarbageReply()
    {
        var (_, line) = Pair(_ => TwinReply.Raw("RAW 12*00\n"u8.ToArray()), retries: 0, framing: ChecksumFraming.Instance);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync("RAW?", ReplyParse<string>.Ok, default));

        Assert.Equal(InstrumentFaultKind.GarbageReply, fault.Kind);
        Assert.Contains("checksum 00", fault.Message, StringComparison.Ordinal);
    }

    [LinuxFact]
    public async Task QueryAsync_InstrumentError_IsNotRetried()
    {
        var (server, line) = Pair(_ => TwinReply.Answer("ERR 5,busy"), retries: 2);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync(
            "X?", r => r.StartsWith("ERR", StringComparison.Ordinal) ? ReplyParse<string>.Error(r[4..]) : ReplyParse<string>.Ok(r), default));

        Assert.Equal(InstrumentFaultKind.InstrumentError, fault.Kind);
        Assert.Contains("reported '5,busy' to 'X?'", fault.Message, StringComparison.Ordinal);
        Assert.Single(server.Received);
    }

    [LinuxFact]
    public async Task QueryAsync_PortUnplugged_PortLostThenReopensWhenPluggedBack()
    {
        var (server, line) = Pair(_ => TwinReply.Answer("1"), retries: 1);
        Assert.Equal("1", await line.QueryAsync("A?", ReplyParse<string>.Ok, default));
        var opened = line.OpenCount;

        server.Unplug();
        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync("A?", ReplyParse<string>.Ok, default));
        Assert.Equal(InstrumentFaultKind.PortLost, fault.Kind);
        Assert.Contains(server.PortName, fault.Message, StringComparison.Ordinal);

        server.Replug();
        Assert.Equal("1", await line.QueryAsync("A?", ReplyParse<string>.Ok, default));
        Assert.Equal(opened + 1, line.OpenCount);
    }

    [LinuxFact]
    public async Task QueryAsync_PortMissing_PortLostSaysItDoesNotExist()
    {
        using var line = new SerialLine("meter", new PortDefinition { Name = _folder.Port("nothing-here"), TimeoutMs = 100 }, PlainFraming.Instance, NullLogger.Instance, TimeProvider.System);

        var fault = await Assert.ThrowsAsync<InstrumentFaultException>(() => line.QueryAsync("*IDN?", ReplyParse<string>.Ok, default));

        Assert.Equal(InstrumentFaultKind.PortLost, fault.Kind);
        Assert.Contains("does not exist", fault.Message, StringComparison.Ordinal);
    }

    public void Dispose()
    {
        // Serial ports first, then the servers (the master ends): the other order can hang.
        foreach (var item in Enumerable.Reverse(_owned))
        {
            item.Dispose();
        }

        _folder.Dispose();
    }

    private (LineServer Server, SerialLine Line) Pair(Func<string, TwinReply> handler, int retries = 2, ILineFraming? framing = null, int timeoutMs = 2000)
    {
        framing ??= PlainFraming.Instance;
        var server = new LineServer("scripted", _folder.Port($"tty{_owned.Count}"), framing, handler, NullLogger.Instance);
        _owned.Add(server);
        var line = new SerialLine("source", new PortDefinition { Name = server.PortName, TimeoutMs = timeoutMs, Retries = retries }, framing, NullLogger.Instance, TimeProvider.System);
        _owned.Add(line);
        return (server, line);
    }
}
