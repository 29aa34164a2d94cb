using LineTest.Rig.Instruments;

namespace LineTest.Rig.Fuzzing;

/// <summary>
/// Draws garbage replies from random bytes: numbers from any 64-bit pattern (NaN, infinities, subnormals, huge values
/// included), text of random characters, random integers and register sets, or the fault a parser raises on a reply
/// it cannot read. Seeded, so a failing case can be replayed.
/// </summary>
internal sealed class GarbageGenerator(int seed, double rate)
{
    private static readonly double[] Awkward = [double.NaN, double.PositiveInfinity, double.NegativeInfinity, 0, -0.0, double.MaxValue, double.MinValue, double.Epsilon, 1e300, -1e-300];

    private readonly Random _random = new(seed);

    /// <summary>How many garbage replies were given.</summary>
    public int Count { get; private set; }

    /// <summary>Whether this reply is garbage.</summary>
    public bool Hit()
    {
        var hit = _random.NextDouble() < rate;
        if (hit)
        {
            Count++;
        }

        return hit;
    }

    public double Number()
    {
        if (_random.Next(3) == 0)
        {
            return Awkward[_random.Next(Awkward.Length)];
        }

        Span<byte> bytes = stackalloc byte[8];
        _random.NextBytes(bytes);
        return BitConverter.ToDouble(bytes);
    }

    public long Integer()
    {
        Span<byte> bytes = stackalloc byte[8];
        _random.NextBytes(bytes);
        return _random.Next(4) switch
        {
            0 => long.MaxValue,
            1 => long.MinValue,
            _ => BitConverter.ToInt64(bytes),
        };
    }

    public string Text()
    {
        var length = _random.Next(0, 40);
        var chars = new char[length];
        for (var i = 0; i < length; i++)
        {
            chars[i] = (char)_random.Next(0, 0xD7FF);
        }

        return new string(chars);
    }

    public IReadOnlyDictionary<string, long> Registers(IEnumerable<string> names)
    {
        var result = new Dictionary<string, long>(StringComparer.Ordinal);
        foreach (var name in names)
        {
            if (_random.Next(4) != 0)
            {
                result[name] = Integer();
            }
        }

        if (_random.Next(3) == 0)
        {
            result[Text()] = Integer();
        }

        return result;
    }

    /// <summary>A random number, or (one time in four) the fault of an unreadable reply.</summary>
    public Task<double> NumberOrFailAsync(string instrument) =>
        _random.Next(4) == 0
            ? Task.FromException<double>(Unreadable(instrument))
            : Task.FromResult(Number());

    public Task Fail(string instrument) => Task.FromException(Unreadable(instrument));

    private static InstrumentFaultException Unreadable(string instrument) =>
        new(instrument, InstrumentFaultKind.GarbageReply, "the reply could not be understood (garbage injected)");
}
