using System.Text.Json;
using LineTest.Core.Trims;

namespace LineTest.Core.Tests.Trims;

public sealed class FirmwareTrimSpecTests
{
    [Fact]
    public void Deserialize_DocumentedJson_ReadsEveryField()
    {
        const string json = """
            { "order": 1, "coefficients": [ { "register": "C0", "bits": 16, "fractionalBits": 8 },
                                            { "register": "C1", "bits": 32, "scale": 1e-7 } ] }
            """;

        var spec = JsonSerializer.Deserialize<FirmwareTrimSpec>(json, new JsonSerializerOptions(JsonSerializerDefaults.Web))!;

        Assert.Equal(1, spec.Order);
        Assert.Equal(8, spec.Coefficients[0].FractionalBits);
        Assert.Equal(1e-7, spec.Coefficients[1].Scale);
        Assert.Empty(spec.Check());
    }

    [Fact]
    public void Serialize_LeavesOutDerivedValues()
    {
        var json = JsonSerializer.Serialize(
            new FirmwareCoefficientSpec { Register = "C0", Bits = 16, FractionalBits = 8 },
            new JsonSerializerOptions(JsonSerializerDefaults.Web));

        Assert.DoesNotContain("lsb", json, StringComparison.Ordinal);
        Assert.DoesNotContain("minValue", json, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_OrderThreeAndDuplicateRegister_ListsBoth()
    {
        var spec = new FirmwareTrimSpec
        {
            Order = 3,
            Coefficients =
            [
                new FirmwareCoefficientSpec { Register = "C0", Bits = 16, FractionalBits = 8 },
                new FirmwareCoefficientSpec { Register = "C0", Bits = 16, FractionalBits = 8 },
            ],
        };

        var problems = spec.Check();

        Assert.Contains(new SpecProblem("order", "3 is not 1 (line) or 2 (quadratic)"), problems);
        Assert.Contains(new SpecProblem("coefficients[1].register", "register 'C0' is used more than once"), problems);
    }
}
