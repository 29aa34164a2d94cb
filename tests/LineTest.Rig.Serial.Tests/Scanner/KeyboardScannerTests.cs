using LineTest.Rig.Serial.Scanner;

namespace LineTest.Rig.Serial.Tests.Scanner;

public sealed class KeyboardScannerTests
{
    [Fact]
    public async Task NextAsync_TypedLines_SerialsRejectsAndEnd()
    {
        var scanner = new KeyboardScanner(new StringReader("  CTP40A-2612-000001\r\n\nbad serial!\n"));

        var first = await scanner.NextAsync(default);
        var empty = await scanner.NextAsync(default);
        var bad = await scanner.NextAsync(default);
        var end = await scanner.NextAsync(default);

        Assert.Equal("CTP40A-2612-000001", first.Serial);
        Assert.Equal("an empty scan", empty.Problem);
        Assert.Contains("' ' at position 4", bad.Problem, StringComparison.Ordinal);
        Assert.True(end.EndOfInput);
    }
}
