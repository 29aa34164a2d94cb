using System.Globalization;
using System.Text.Json.Serialization;
using LineTest.Core.Definitions;

namespace LineTest.Core.Trims;

/// <summary>
/// The signed fixed-point register that holds one firmware coefficient: a two's-complement integer q of
/// <see cref="Bits"/> bits (sign included) whose value is q·LSB, with LSB = 2^−<see cref="FractionalBits"/>
/// (a Q format) or LSB = <see cref="Scale"/>. Give exactly one of the two.
/// </summary>
/// <remarks>
/// Example: a Q7.8 coefficient in a 16-bit register is <c>{ "register": "C0", "bits": 16, "fractionalBits": 8 }</c>:
/// q ∈ [−32768, 32767], value = q/256 ∈ [−128, 127.996]. Widths are limited to 53 bits so every register
/// value is exact as a double in the stored trim record.
/// </remarks>
public sealed record FirmwareCoefficientSpec
{
    /// <summary>Widest register supported: 53 bits, the integer precision of a double.</summary>
    public const int MaxBits = 53;

    /// <summary>Register name written over the unit link, e.g. <c>C1</c>.</summary>
    public required string Register { get; init; }

    /// <summary>Register width in bits, sign included (2…53).</summary>
    public required int Bits { get; init; }

    /// <summary>Fractional bits n of a Q format: LSB = 2^−n (may be negative for coarse scales).</summary>
    public int? FractionalBits { get; init; }

    /// <summary>LSB weight, used instead of <see cref="FractionalBits"/>.</summary>
    public double? Scale { get; init; }

    /// <summary>Value of one count of the register.</summary>
    [JsonIgnore]
    public double Lsb => Scale ?? Math.ScaleB(1.0, -(FractionalBits ?? 0));

    /// <summary>Smallest register value, −2^(Bits−1).</summary>
    [JsonIgnore]
    public long MinValue => -(1L << (Bits - 1));

    /// <summary>Largest register value, 2^(Bits−1) − 1.</summary>
    [JsonIgnore]
    public long MaxValue => (1L << (Bits - 1)) - 1;

    /// <summary>The coefficient a register value stands for: q·LSB.</summary>
    public double Dequantise(long registerValue) => registerValue * Lsb;

    /// <summary>
    /// Sign-extends the raw bits a unit link reads back (e.g. 0xFFFE from a 16-bit register → −2).
    /// Bits above the register width must be zero.
    /// </summary>
    public long FromRegisterBits(ulong bits)
    {
        if (Bits < 64 && bits >> Bits != 0)
        {
            throw new ArgumentOutOfRangeException(
                nameof(bits), bits, string.Create(CultureInfo.InvariantCulture, $"Register {Register} is {Bits} bits wide."));
        }

        var shift = 64 - Bits;
        return unchecked((long)(bits << shift)) >> shift;
    }

    /// <summary>The raw two's-complement bits of a register value, for links that write unsigned words.</summary>
    public ulong ToRegisterBits(long registerValue)
    {
        if (registerValue < MinValue || registerValue > MaxValue)
        {
            throw new ArgumentOutOfRangeException(nameof(registerValue), registerValue, $"Register {Register} holds {MinValue}…{MaxValue}.");
        }

        return unchecked((ulong)registerValue) & (Bits == 64 ? ulong.MaxValue : (1UL << Bits) - 1);
    }

    /// <summary>Problems with this register's declaration, each with its path relative to the register object.</summary>
    public IReadOnlyList<SpecProblem> Check()
    {
        var problems = new List<SpecProblem>();
        if (DefinitionBounds.RegisterName.Refusal(Register) is { } register)
        {
            problems.Add(new("register", register));
        }

        if (Bits is < 2 or > MaxBits)
        {
            problems.Add(new("bits", string.Create(CultureInfo.InvariantCulture, $"{Bits} is outside 2…{MaxBits}")));
        }

        if (FractionalBits is null == Scale is null)
        {
            problems.Add(new(string.Empty, "give exactly one of fractionalBits and scale"));
        }

        if (FractionalBits is { } n && Math.Abs(n) > 200)
        {
            problems.Add(new("fractionalBits", string.Create(CultureInfo.InvariantCulture, $"{n} is not a usable format")));
        }

        if (Scale is { } scale && !(scale > 0.0 && double.IsFinite(scale)))
        {
            problems.Add(new("scale", "must be positive"));
        }

        return problems;
    }
}
