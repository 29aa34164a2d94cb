using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class FirmwareCoefficientSpecTests
{
    private static readonly FirmwareCoefficientSpec Q8In16 = new() { Register = "C0", Bits = 16, FractionalBits = 8 };

    [Fact]
    public void Range_SixteenBitSigned_IsTwosComplement()
    {
        // Two's complement, 16 bits: −2¹⁵ … 2¹⁵ − 1 [common practice]; Q7.8 spans −128 … 127.99609375.
        Assert.Equal(-32768, Q8In16.MinValue);
        Assert.Equal(32767, Q8In16.MaxValue);
        Assert.Equal(1.0 / 256, Q8In16.Lsb);
        Assert.Equal(127.99609375, Q8In16.Dequantise(Q8In16.MaxValue));
    }

    [Fact]
    public void Lsb_Scale_OverridesQFormat()
    {
        Assert.Equal(1e-6, new FirmwareCoefficientSpec { Register = "C1", Bits = 32, Scale = 1e-6 }.Lsb);
    }

    [Theory]
    [InlineData(0xFFFEUL, -2L)]
    [InlineData(0x8000UL, -32768L)]
    [InlineData(0x7FFFUL, 32767L)]
    [InlineData(0x0001UL, 1L)]
    public void FromRegisterBits_SignExtends(ulong bits, long expected)
    {
        Assert.Equal(expected, Q8In16.FromRegisterBits(bits));
        Assert.Equal(bits, Q8In16.ToRegisterBits(expected));
    }

    [Fact]
    public void FromRegisterBits_BitsAboveWidth_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => Q8In16.FromRegisterBits(0x1_0000UL));
    }

    [Fact]
    public void Check_BothFractionalBitsAndScale_IsAProblem()
    {
        var problems = new FirmwareCoefficientSpec { Register = "C0", Bits = 16, FractionalBits = 8, Scale = 0.01 }.Check();

        Assert.Equal([new SpecProblem(string.Empty, "give exactly one of fractionalBits and scale")], problems);
    }

    [Fact]
    public void Check_TooWide_IsAProblem()
    {
        var problems = new FirmwareCoefficientSpec { Register = "C0", Bits = 64, FractionalBits = 8 }.Check();

        Assert.Contains(new SpecProblem("bits", "64 is outside 2…53"), problems);
    }
}
