using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class PlainFramingTests
{
    [Fact]
    [Trait("Category", "Fuzz")]
    public void Decode_AnyLine_IsTheMessageItself()
        => WireFuzz.Line.Sample(line =>
        {
            var decoded = PlainFraming.Instance.Decode(line);
            Assert.True(decoded.IsOk);
            Assert.Equal(line, decoded.Value);
            Assert.Equal(line, PlainFraming.Instance.Encode(line));
        }, iter: WireFuzz.Iterations, print: WireFuzz.Show);
}
