namespace LineTest.Rig.Serial.Transport;

/// <summary>An instrument's answer to the IEEE 488.2 <c>*IDN?</c> query: maker, model, serial number, firmware.</summary>
public sealed record InstrumentIdentity(string Maker, string Model, string SerialNumber, string Firmware)
{
    /// <summary>Parses the four comma-separated fields of an <c>*IDN?</c> reply (IEEE 488.2 §10.14).</summary>
    public static ReplyParse<InstrumentIdentity> Parse(string reply)
    {
        ArgumentNullException.ThrowIfNull(reply);
        var fields = reply.Split(',');
        if (fields.Length != 4 || fields.Any(f => f.Trim().Length == 0))
        {
            return ReplyParse<InstrumentIdentity>.NotUnderstood("an identity must have four fields: maker,model,serial,firmware");
        }

        return ReplyParse<InstrumentIdentity>.Ok(new InstrumentIdentity(fields[0].Trim(), fields[1].Trim(), fields[2].Trim(), fields[3].Trim()));
    }

    /// <summary>The reply form of this identity.</summary>
    public override string ToString() => $"{Maker},{Model},{SerialNumber},{Firmware}";
}
