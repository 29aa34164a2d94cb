using System.Text.Json;
using System.Text.Json.Serialization;
using LineTest.Core.Results;

namespace LineTest.Storage.Json;

/// <summary>
/// The one JSON form of a <see cref="RunRecord"/> used in the database (<c>run_json</c>): camelCase names,
/// verdicts as words (pass/fail/error), every property written (nulls included), no indentation.
/// The stored text is what the hash chain covers, so it is never re-serialised for verification.
/// </summary>
public static class RunJson
{
    /// <summary>The serializer options. Shared and read-only.</summary>
    public static JsonSerializerOptions Options { get; } = CreateOptions();

    /// <summary>Serialises a run to its stored text.</summary>
    public static string Serialize(RunRecord run)
    {
        ArgumentNullException.ThrowIfNull(run);
        return JsonSerializer.Serialize(run, Options);
    }

    /// <summary>Reads a run back from its stored text.</summary>
    /// <exception cref="JsonException">The text is not a run record.</exception>
    public static RunRecord Deserialize(string json)
    {
        ArgumentNullException.ThrowIfNull(json);
        return JsonSerializer.Deserialize<RunRecord>(json, Options)
            ?? throw new JsonException("The stored run is the JSON literal null, not a run record.");
    }

    private static JsonSerializerOptions CreateOptions()
    {
        var options = new JsonSerializerOptions(JsonSerializerDefaults.Web)
        {
            WriteIndented = false,
            DefaultIgnoreCondition = JsonIgnoreCondition.Never,
            // A reading may legitimately carry NaN (e.g. a fit on degenerate data); refusing it would stop the
            // station over a value, so it is written as the literal "NaN" rather than rejected.
            NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
            // Dictionary keys are names chosen by the sequence (gainCode, R7): keep them as written.
            DictionaryKeyPolicy = null,
            RespectRequiredConstructorParameters = false,
        };
        options.MakeReadOnly(populateMissingResolver: true);
        return options;
    }
}
