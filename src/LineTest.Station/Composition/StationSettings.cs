using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using Microsoft.Extensions.Configuration;

namespace LineTest.Station.Composition;

/// <summary>
/// The settings every command starts from: appsettings.json in the content root and <c>LINETEST_</c> environment
/// variables, with the <c>Station</c> section bound to <see cref="StationOptions"/>. A settings file that is not JSON, or
/// a value of the wrong type, is a plain message naming the file and line or the key, never a stack trace.
/// </summary>
public static partial class StationSettings
{
    /// <summary>The settings file's name in the content root.</summary>
    public const string FileName = "appsettings.json";

    /// <summary>Reads the settings from <paramref name="contentRoot"/>; on failure <c>Error</c> says where and why.</summary>
    public static (IConfigurationRoot? Configuration, StationOptions? Options, string? Error) Load(string contentRoot)
    {
        ArgumentNullException.ThrowIfNull(contentRoot);
        IConfigurationRoot configuration;
        try
        {
            configuration = StationLogging.Configuration(contentRoot);
        }
        catch (InvalidDataException ex)
        {
            return (null, null, NotJson(ex, Path.Combine(contentRoot, FileName)));
        }

        var options = new StationOptions();
        try
        {
            configuration.GetSection(StationOptions.Section).Bind(options);
        }
        catch (InvalidOperationException ex)
        {
            return (null, null, WrongType(ex));
        }

        return (configuration, options, null);
    }

    private static string NotJson(InvalidDataException ex, string path)
    {
        for (Exception? inner = ex; inner is not null; inner = inner.InnerException)
        {
            if (inner is JsonException { LineNumber: { } line } json)
            {
                // The reader's message ends with its own zero-based position; the line is given in front instead.
                var reason = json.Message;
                var cut = reason.IndexOf(" LineNumber:", StringComparison.Ordinal);
                reason = cut > 0 ? reason[..cut] : reason;
                return $"{path}:{(line + 1).ToString(CultureInfo.InvariantCulture)}: the settings file is not valid JSON: {reason}";
            }
        }

        return $"{path}: the settings file cannot be read: {ex.InnerException?.Message ?? ex.Message}";
    }

    private static string WrongType(InvalidOperationException ex)
    {
        var match = ConversionFailure().Match(ex.Message);
        if (!match.Success)
        {
            return $"the settings cannot be read ({FileName} or a LINETEST_ variable): {ex.Message}";
        }

        var wanted = match.Groups["type"].Value switch
        {
            "System.Double" or "System.Single" or "System.Decimal" => "a number",
            "System.Int32" or "System.Int64" or "System.Int16" => "a whole number",
            "System.Boolean" => "true or false",
            "System.TimeSpan" => "a time span such as 00:30:00",
            var other => $"a value of type {other}",
        };
        return $"{match.Groups["key"].Value} ({FileName} or a LINETEST_ variable): '{match.Groups["value"].Value}' is not {wanted}";
    }

    [GeneratedRegex(@"value '(?<value>.*)' at '(?<key>[^']*)' to type '(?<type>[^']*)'", RegexOptions.Singleline, matchTimeoutMilliseconds: 1000)]
    private static partial Regex ConversionFailure();
}
