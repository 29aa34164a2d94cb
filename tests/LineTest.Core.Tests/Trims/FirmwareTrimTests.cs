using CsCheck;
using LineTest.Core.Calibration;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class FirmwareTrimTests
{
    // c0 in Q7.8 (16 bits, LSB 1/256 °C); c1 in Q7.24 (32 bits, LSB 2⁻²⁴ °C/count).
    private static readonly FirmwareTrimSpec Linear = new()
    {
        Order = 1,
        Coefficients =
        [
            new FirmwareCoefficientSpec { Register = "C0", Bits = 16, FractionalBits = 8 },
            new FirmwareCoefficientSpec { Register = "C1", Bits = 32, FractionalBits = 24 },
        ],
    };

    private static readonly CalibrationPoint[] Points = [new("cold", -20.1, 10_000), new("hot", 79.9, 30_000)];

    [Fact]
    public void Compute_TwoPointLine_MatchesHandWorkedQuantisation()
    {
        // Hand-worked. Fit: c1 = 100/20 000 = 0.005 °C/count, c0 = −20.1 − 0.005·10 000 = −70.1 °C.
        // C0: −70.1·256 = −17 945.6 → −17 946 → −70.1015625 (error −0.0015625 °C).
        // C1: 0.005·2²⁴ = 83 886.08 → 83 886 → 0.00499999523…, Δc1 = −0.08/2²⁴ = −4.76837158e-9.
        // Error at 10 000: −0.0015625 − 4.76837158e-5 = −0.0016101837; at 30 000: −0.0015625 − 1.43051147e-4
        // = −0.0017055511. Verify at 30 °C: r = (30 + 70.1)/0.005 = 20 020 → −0.0015625 − 9.54628e-5 = −0.0016579628.
        // Bound: 1/512 + 2⁻²⁵·30 000 = 0.001953125 + 0.00089406967 = 0.0028471947.
        var result = FirmwareTrim.Compute(Linear, Points, [new TrimCheckpoint("verify", 30)]).Value;

        Assert.Equal(-17946, result.Registers[0].Value);
        Assert.Equal(-70.1015625, result.Registers[0].Coefficient);
        Assert.Equal(83886, result.Registers[1].Value);
        Assert.Equal(83886.0 / 16_777_216, result.Registers[1].Coefficient);
        Assert.True(result.InRange);
        Assert.Equal(-0.0016101837, result.PredictedErrors[0].ErrorC, 10);
        Assert.Equal(-0.0017055511, result.PredictedErrors[1].ErrorC, 10);
        Assert.Equal(-0.0016579628, result.PredictedErrors[2].ErrorC, 9);
        Assert.Equal(0.0028471947, result.QuantisationBoundC, 10);
    }

    [Theory]
    [InlineData(1.2345, 316L, 1.234375)]          // 1.2345·256 = 316.032 → 316
    [InlineData(-0.5, -128L, -0.5)]                // exact
    [InlineData(0.001953125, 1L, 0.00390625)]      // 0.5 count: half away from zero → 1
    [InlineData(-0.001953125, -1L, -0.00390625)]   // −0.5 count → −1
    public void Compute_ConstantCoefficient_RoundsHalfAwayFromZero(double c0, long expectedValue, double expectedCoefficient)
    {
        // Hand-worked Q7.8 quantisation (LSB 1/256) of c0, on the line T = c0 + 0.001·r.
        CalibrationPoint[] points = [new("a", c0, 0), new("b", c0 + 1, 1000)];

        var result = FirmwareTrim.Compute(Linear, points).Value;

        Assert.Equal(expectedValue, result.Registers[0].Value);
        Assert.Equal(expectedCoefficient, result.Registers[0].Coefficient);
    }

    [Fact]
    public void Compute_CoefficientOutOfRange_SaysWhichRegister()
    {
        // Hand-worked: c0 = 200 °C → 200·256 = 51 200 > 32 767.
        CalibrationPoint[] points = [new("a", 200, 0), new("b", 201, 1000)];

        var result = FirmwareTrim.Compute(Linear, points).Value;

        Assert.False(result.InRange);
        Assert.Equal(["register C0: coefficient 200 needs 51200, range -32768…32767"], result.Problems);
    }

    [Fact]
    public void Compute_QuadraticWithScale_ReproducesACurvedSensor()
    {
        // A thermistor-like curved response: T = 150 − 0.004·r + 2e-8·r² at r = 5 000 … 45 000 counts.
        var spec = new FirmwareTrimSpec
        {
            Order = 2,
            Coefficients =
            [
                new FirmwareCoefficientSpec { Register = "K0", Bits = 32, Scale = 1e-6 },
                new FirmwareCoefficientSpec { Register = "K1", Bits = 32, Scale = 1e-10 },
                new FirmwareCoefficientSpec { Register = "K2", Bits = 32, Scale = 1e-15 },
            ],
        };
        double T(double r) => 150 - (0.004 * r) + (2e-8 * r * r);
        CalibrationPoint[] points = [new("a", T(5000), 5000), new("b", T(20_000), 20_000), new("c", T(45_000), 45_000)];

        var result = FirmwareTrim.Compute(spec, points, [new TrimCheckpoint("verify", 50)]).Value;

        // Hand-worked: 150/1e-6 = 150 000 000; −0.004/1e-10 = −40 000 000; 2e-8/1e-15 = 20 000 000.
        Assert.Equal([150_000_000L, -40_000_000L, 20_000_000L], result.Registers.Select(r => r.Value));
        Assert.All(result.PredictedErrors, e => Assert.InRange(Math.Abs(e.ErrorC), 0, result.QuantisationBoundC));
    }

    [Fact]
    public void Compute_CheckpointBeyondTheCurve_IsAProblem()
    {
        // T = 150 − 0.004·r + 2e-8·r² has its minimum 150 − 0.004²/(4·2e-8) = −50 °C: −60 °C cannot be indicated.
        var spec = new FirmwareTrimSpec
        {
            Order = 2,
            Coefficients =
            [
                new FirmwareCoefficientSpec { Register = "K0", Bits = 32, Scale = 1e-6 },
                new FirmwareCoefficientSpec { Register = "K1", Bits = 32, Scale = 1e-10 },
                new FirmwareCoefficientSpec { Register = "K2", Bits = 32, Scale = 1e-15 },
            ],
        };
        double T(double r) => 150 - (0.004 * r) + (2e-8 * r * r);
        CalibrationPoint[] points = [new("a", T(5000), 5000), new("b", T(20_000), 20_000), new("c", T(45_000), 45_000)];

        var result = FirmwareTrim.Compute(spec, points, [new TrimCheckpoint("cold", -60)]).Value;

        Assert.Contains("checkpoint 'cold' at -60 °C is beyond what the fitted curve can indicate", result.Problems);
    }

    [Fact]
    public void Compute_AllRawEqual_FailsAsStuckReading()
    {
        CalibrationPoint[] points = [new("a", -20, 12_345), new("b", 80, 12_345)];

        var result = FirmwareTrim.Compute(Linear, points);

        Assert.False(result.Succeeded);
        Assert.Contains("same unit output (12345)", result.Reason);
    }

    [Fact]
    public void Compute_OrderMismatch_FailsNamingTheField()
    {
        var result = FirmwareTrim.Compute(Linear with { Order = 2 }, Points);

        Assert.False(result.Succeeded);
        Assert.Contains("coefficients: order 2 needs 3 registers, got 2", result.Reason);
    }

    [Fact]
    public void CheckReadBack_AllMatch_Succeeds()
    {
        var written = FirmwareTrim.Compute(Linear, Points).Value;

        var check = FirmwareTrim.CheckReadBack(written, new Dictionary<string, long> { ["C0"] = -17946, ["C1"] = 83886 });

        Assert.True(check.Succeeded);
    }

    [Fact]
    public void CheckReadBack_MismatchAndMissing_NamesBothRegisters()
    {
        var written = FirmwareTrim.Compute(Linear, Points).Value;

        var check = FirmwareTrim.CheckReadBack(written, new Dictionary<string, long> { ["C0"] = -17945 });

        Assert.False(check.Succeeded);
        Assert.Equal("register C0 read back -17945, -17946 was written; register C1 was not read back", check.Reason);
    }

    [Fact]
    public void ToRecord_CarriesRegisterValuesAndCoefficients()
    {
        var record = FirmwareTrim.Compute(Linear, Points, [new TrimCheckpoint("verify", 30)]).Value.ToRecord();

        Assert.Equal("firmware", record.Method);
        Assert.Equal(-17946, record.Values["C0"]);
        Assert.Equal(-70.1015625, record.Values["coefficient.c0"]);
        Assert.Equal(0.005, record.Inputs["fit.c1"], 12);
        Assert.Equal(-0.0016579628, record.PredictedErrorC["verify"], 9);
    }

    [Fact]
    public void Compute_RandomUnits_DequantisedCoefficientsReproduceTheFitWithinTheBound()
    {
        var cases =
            from c0 in Gen.Double[-100, 100]
            from c1 in Gen.Double[1e-3, 1e-2]
            from c2 in Gen.Double[-1e-8, 1e-8]
            from order in Gen.Int[1, 2]
            from fractional in Gen.Int[4, 12]
            from raws in Gen.Int[0, 65_535].Array[4, 8]
            from probe in Gen.Double[0, 1]
            where raws.Distinct().Count() >= 3 && raws.Max() - raws.Min() > 1000
            select (c0, c1, c2, order, fractional, raws, probe);

        cases.Sample(c =>
        {
            var spec = new FirmwareTrimSpec
            {
                Order = c.order,
                Coefficients = Enumerable.Range(0, c.order + 1)
                    .Select(i => new FirmwareCoefficientSpec { Register = $"C{i}", Bits = 53, FractionalBits = c.fractional + (20 * i) })
                    .ToArray(),
            };
            var points = c.raws.Select((r, i) => new CalibrationPoint($"p{i}", c.c0 + (c.c1 * r) + (c.order == 2 ? c.c2 * r * r : 0), r)).ToArray();

            var result = FirmwareTrim.Compute(spec, points).Value;
            Assert.True(result.InRange, string.Join("; ", result.Problems));

            // Anywhere across the calibration readings, the firmware's curve stays within the bound of the fit.
            var raw = c.raws.Min() + (c.probe * (c.raws.Max() - c.raws.Min()));
            Assert.InRange(Math.Abs(result.IndicatedC(raw) - result.Fit.Evaluate(raw)), 0, result.QuantisationBoundC * (1 + 1e-9));

            // At the calibration points the prediction is what the firmware will show.
            for (var i = 0; i < points.Length; i++)
            {
                Assert.Equal(result.IndicatedC(points[i].Output) - points[i].ReferenceC, result.PredictedErrors[i].ErrorC, 1e-9);
            }
        }, iter: 200);
    }
}
