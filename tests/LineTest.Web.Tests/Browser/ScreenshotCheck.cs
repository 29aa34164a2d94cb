using SkiaSharp;

namespace LineTest.Web.Tests.Browser;

/// <summary>Checks that a screenshot shows something: enough pixels that are not the background, in several colours.</summary>
internal static class ScreenshotCheck
{
    /// <summary>Why the PNG looks blank, or null when it does not.</summary>
    public static string? WhyBlank(byte[] png, int expectedWidth, int expectedHeight)
    {
        using var bitmap = SKBitmap.Decode(png);
        if (bitmap is null)
        {
            return "the screenshot is not a PNG";
        }

        if (bitmap.Width != expectedWidth || bitmap.Height != expectedHeight)
        {
            return $"the screenshot is {bitmap.Width}×{bitmap.Height}, not {expectedWidth}×{expectedHeight}";
        }

        var background = bitmap.GetPixel(bitmap.Width - 1, bitmap.Height - 1);
        var colours = new HashSet<uint>();
        long drawn = 0, total = 0;
        for (var y = 0; y < bitmap.Height; y += 2)
        {
            for (var x = 0; x < bitmap.Width; x += 2)
            {
                var pixel = bitmap.GetPixel(x, y);
                total++;
                if (pixel != background)
                {
                    drawn++;
                }

                colours.Add((uint)pixel);
            }
        }

        var share = (double)drawn / total;
        return share < 0.03 || colours.Count < 16
            ? $"the screenshot looks blank: {share:P1} of pixels differ from the background, {colours.Count} colours"
            : null;
    }
}
