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
