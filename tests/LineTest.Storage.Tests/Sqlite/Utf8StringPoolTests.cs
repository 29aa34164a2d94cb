using System.Text;
using LineTest.Storage.Sqlite;

namespace LineTest.Storage.Tests.Sqlite;

public sealed class Utf8StringPoolTests
{
    [Theory]
    [InlineData("verify.error")]
    [InlineData("°C")]
    [InlineData("")]
    public void Get_SameText_SameInstanceAndExactText(string text)
    {
        var pool = new Utf8StringPool();

        var first = pool.Get(Encoding.UTF8.GetBytes(text));
        var second = pool.Get(Encoding.UTF8.GetBytes(text));

        Assert.Equal(text, first);
        Assert.Same(first, second);
    }

    [Fact]
    public void Get_LongText_DecodedWithoutPooling()
    {
        var pool = new Utf8StringPool();
        var text = new string('x', 300);

        var first = pool.Get(Encoding.UTF8.GetBytes(text));
        var second = pool.Get(Encoding.UTF8.GetBytes(text));

        Assert.Equal(text, second);
        Assert.NotSame(first, second);
    }

    [Fact]
    public void Get_MoreDistinctTextsThanTheLimit_StillDecodesEveryText()
    {
        var pool = new Utf8StringPool();

        for (var i = 0; i < Utf8StringPool.MaxEntries + 10; i++)
        {
            Assert.Equal($"n{i}", pool.Get(Encoding.UTF8.GetBytes($"n{i}")));
        }
    }
}
