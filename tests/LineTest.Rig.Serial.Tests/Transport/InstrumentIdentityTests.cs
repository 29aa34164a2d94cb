using CsCheck;
using LineTest.Rig.Serial.Transport;

namespace LineTest.Rig.Serial.Tests.Transport;

public sealed class InstrumentIdentityTests
{
    // A field as an instrument sends it: printable ASCII without commas, not blank, no blanks around it.
    private static readonly Gen<string> Field = Gen.String[Gen.Char[' ', '~'].Where(c => c != ','), 1, 20]
        .Select(f => f.Trim())
        .Where(f => f.Length > 0);

    private static readonly Gen<InstrumentIdentity> Identities = Gen.Select(Field, Field, Field, Field, (a, b, c, d) => new InstrumentIdentity(a, b, c, d));

    [Fact]
    public void Parse_Ieee4882Reply_FourFieldsTrimmed()
        => Assert.Equal(new InstrumentIdentity("Maker", "DMM 6", "SN1", "1.0"), InstrumentIdentity.Parse("Maker, DMM 6 ,SN1,1.0").Value);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void Parse_RandomAndMutatedLines_FourNonBlankFieldsOrGarbage()
        => WireFuzz.MatchesGrammar(WireFuzz.LinesAround(Identities.Select(i => i.ToString())), InstrumentIdentity.Parse, ProtocolGrammar.Identity);

    [Fact]
    [Trait("Category", "Fuzz")]
    public void Parse_ReplyForm_RoundTrips()
        => Identities.Sample(identity => Assert.Equal(identity, InstrumentIdentity.Parse(identity.ToString()).Value), iter: WireFuzz.Iterations);
}
