using CsCheck;
using LineTest.Core.Statistics;

namespace LineTest.Core.Tests.Statistics;

/// <summary>The radix sort against the framework's comparison sort (Array.Sort), the reference it replaces.</summary>
public sealed class DoubleSortTests
{
    [Fact]
    public void Ascending_AnyDoublesAboveTheThreshold_SameOrderAsArraySortAndTheSameValues()
    {
        // Mixed magnitudes, both signs, subnormals, ±0, ±∞ and repeats: every region of the bit patterns.
        double[] specials = [0.0, -0.0, double.Epsilon, -double.Epsilon, double.MaxValue, double.MinValue, double.PositiveInfinity, double.NegativeInfinity, 1.0, -1.0];
        var special = Gen.Int[0, specials.Length - 1].Select(i => specials[i]);
        var value = Gen.Frequency((6, Gen.Double), (2, Gen.Double[-1e3, 1e3]), (1, special));
        value.Array[4096, 9000].Sample(values =>
        {
            var expected = (double[])values.Clone();
            Array.Sort(expected);
            var actual = (double[])values.Clone();

            DoubleSort.Ascending(actual);

            for (var i = 0; i < actual.Length; i++)
            {
                // Equal as numbers (−0 and +0 may trade places in the comparison sort) …
                Assert.True(expected[i] == actual[i] || (double.IsNaN(expected[i]) && double.IsNaN(actual[i])), $"at {i}: {expected[i]} against {actual[i]}");
                if (i > 0)
                {
                    Assert.True(actual[i - 1] <= actual[i]);
                }
            }

            // … and the very same bit patterns overall: nothing changed, lost or made up.
            Assert.Equal(
                values.Select(BitConverter.DoubleToInt64Bits).Order(),
                actual.Select(BitConverter.DoubleToInt64Bits).Order());
        }, iter: 40);
    }

    [Fact]
    public void Ascending_ReadingsInANarrowBandWithFarOutliersDuplicatesAndSpikes_SameAsArraySort()
    {
        // What a factory's readings look like: a million-scale band around a setpoint (buckets of many keys, sorted again
        // on their own range), exact repeats (a bucket of one key), and a few far outliers that stretch the range so the
        // whole band lands in one bucket first.
        var band = Gen.Double[-0.5, 0.5].Select(d => 25 + d);
        var repeat = Gen.Int[0, 3].Select(i => 25.125 + i);
        var outlier = Gen.OneOf(Gen.Double[-1e9, -1e3], Gen.Double[1e3, 1e300], Gen.Const(double.PositiveInfinity), Gen.Const(-0.0), Gen.Const(0.0));
        var value = Gen.Frequency((90, band), (8, repeat), (1, outlier));
        Gen.Select(value.Array[4096, 40_000], Gen.Int[0, 2]).Sample((values, shape) =>
        {
            if (shape == 1)
            {
                // All one value but one: the range has one bit.
                Array.Fill(values, 25.0);
                values[values.Length / 2] = Math.BitIncrement(25.0);
            }

            var expected = (double[])values.Clone();
            Array.Sort(expected);
            var actual = (double[])values.Clone();

            DoubleSort.Ascending(actual);

            Assert.Equal(expected.Select(BitConverter.DoubleToInt64Bits).Where(b => b != BitConverter.DoubleToInt64Bits(-0.0) && b != 0), actual.Select(BitConverter.DoubleToInt64Bits).Where(b => b != BitConverter.DoubleToInt64Bits(-0.0) && b != 0));
            for (var i = 1; i < actual.Length; i++)
            {
                Assert.True(actual[i - 1] <= actual[i], $"at {i}: {actual[i - 1]} before {actual[i]}");
            }
        }, iter: 30);
    }

    [Fact]
    public void Ascending_AMillionReadingsOfABand_SameAsArraySort()
    {
        // The size a factory report sorts (five series of a million), a normal band of readings from a fixed seed.
        var random = new Random(60751);
        var values = Enumerable.Range(0, 1_000_000).Select(_ => 25 + (0.1 * (random.NextDouble() + random.NextDouble() + random.NextDouble() - 1.5))).ToArray();
        var expected = (double[])values.Clone();
        Array.Sort(expected);

        DoubleSort.Ascending(values);

        Assert.Equal(expected, values);
    }

    [Fact]
    public void Ascending_ANaNAmongThem_SortedAsArraySortDoes()
    {
        var values = Enumerable.Range(0, 5000).Select(i => (double)((i * 7919) % 5000)).ToArray();
        values[1234] = double.NaN;
        var expected = (double[])values.Clone();
        Array.Sort(expected);

        DoubleSort.Ascending(values);

        Assert.True(double.IsNaN(values[0]));
        Assert.Equal(expected.Skip(1), values.Skip(1));
    }

    [Fact]
    public void Ascending_FewValues_Sorted()
    {
        var values = new[] { 3.0, -0.5, 2.0, -7.25 };

        DoubleSort.Ascending(values);

        Assert.Equal([-7.25, -0.5, 2.0, 3.0], values);
    }
}
