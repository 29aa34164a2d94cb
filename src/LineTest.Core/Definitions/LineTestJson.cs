using System.Text.Json;
using System.Text.Json.Serialization;

namespace LineTest.Core.Definitions;

/// <summary>The JSON settings shared by sequence files, fixture files and stored runs.</summary>
public static class LineTestJson
{
    /// <summary>
    /// For reading engineers' files: camelCase keys, strict JSON (comments, trailing commas and keys given twice are
    /// refused by the scan before this is used), unknown keys rejected (a misspelt key must not be silently ignored),
    /// nulls checked against the model.
    /// </summary>
    public static JsonSerializerOptions Definitions { get; } = CreateDefinitions();

    /// <summary>For writing stored runs and reports: camelCase, compact, nulls omitted.</summary>
    public static JsonSerializerOptions Records { get; } = CreateRecords();

    /// <summary>For writing stored runs indented (for people).</summary>
    public static JsonSerializerOptions RecordsIndented { get; } = new(CreateRecords()) { WriteIndented = true };

    private static JsonSerializerOptions CreateDefinitions()
    {
        var options = new JsonSerializerOptions
        {
            PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
            UnmappedMemberHandling = JsonUnmappedMemberHandling.Disallow,
            AllowOutOfOrderMetadataProperties = true,
            AllowDuplicateProperties = false,
            RespectNullableAnnotations = true,
            RespectRequiredConstructorParameters = true,
            NumberHandling = JsonNumberHandling.Strict,
            WriteIndented = true,
        };
        options.MakeReadOnly(populateMissingResolver: true);
        return options;
    }

    private static JsonSerializerOptions CreateRecords()
    {
        var options = new JsonSerializerOptions
        {
            PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
            DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
            AllowOutOfOrderMetadataProperties = true,
            NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        };
        options.MakeReadOnly(populateMissingResolver: true);
        return options;
    }
}
