using System.Text;
using LineTest.Factory.Reporting;

namespace LineTest.Factory.Tests.Reporting;

public sealed class CopyTextCacheTests
{
    [Fact]
    public void Get_SameBytesTwice_TheSameString()
    {
        var cache = new CopyTextCache();
        var first = cache.Get("verify.error"u8);
        cache.Get("trim.gain"u8);
        Assert.Same(first, cache.Get("verify.error"u8));
        Assert.Equal("verify.error", first);
    }

    [Fact]
    public void Get_ManyDistinctTexts_EachDecodedRight()
    {
        // Past the texts it keeps, every text is still decoded, only not shared.
        var cache = new CopyTextCache();
        for (var round = 0; round < 2; round++)
        {
            for (var i = 0; i < 300; i++)
            {
                var text = $"LOT-{i} µ°";
                Assert.Equal(text, cache.Get(Encoding.UTF8.GetBytes(text)));
            }
        }
    }
}
