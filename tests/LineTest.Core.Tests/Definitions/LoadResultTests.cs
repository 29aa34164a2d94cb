using LineTest.Core.Definitions;

namespace LineTest.Core.Tests.Definitions;

public sealed class LoadResultTests
{
    [Fact]
    public void Success_HasValueAndHashAndNoProblems()
    {
        var result = LoadResult<string>.Success("value", "ab12");

        Assert.True(result.IsSuccess);
        Assert.Equal("value", result.Value);
        Assert.Equal("ab12", result.Sha256);
        Assert.Empty(result.Problems);
    }

    [Fact]
    public void Failure_HasProblemsAndNoValue()
    {
        var problem = new DefinitionProblem("f.json", 3, "$.a", "wrong");

        var result = LoadResult<string>.Failure([problem], "ab12");

        Assert.False(result.IsSuccess);
        Assert.Null(result.Value);
        Assert.Equal("ab12", result.Sha256);
        Assert.Equal([problem], result.Problems);
    }
}
