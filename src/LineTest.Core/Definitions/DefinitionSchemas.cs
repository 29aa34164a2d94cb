using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Schema;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Core.Definitions;

/// <summary>
/// JSON Schemas (draft 2020-12) of sequence and fixture files, exported from the very model the loader uses, so
/// an editor completes and checks exactly what the station accepts. Committed as
/// <c>sequences/sequence.schema.json</c> and <c>fixtures/fixture.schema.json</c>; a test keeps them in step.
/// </summary>
public static class DefinitionSchemas
{
    /// <summary>The schema of a sequence file, as indented JSON text.</summary>
    public static string Sequence() => Export(typeof(SequenceDefinition), "LineTest sequence",
        "One product revision's end-of-line test: setpoints, stability and soak, trim method and steps.");

    /// <summary>The schema of a fixture file, as indented JSON text.</summary>
    public static string Fixture() => Export(typeof(FixtureDefinition), "LineTest fixture",
        "A station's fixture: temperature source and safe range, reference thermometer, meter, slot wiring.");

    private static string Export(Type type, string title, string description)
    {
        var exporter = new JsonSchemaExporterOptions
        {
            TreatNullObliviousAsNonNullable = true,
            TransformSchemaNode = (context, node) =>
            {
                // Property docs would need XML doc files at run time; the property names are self-explaining and
                // the README and DEVELOPERS.md describe them.
                if (context.PropertyInfo is null && context.TypeInfo.Type == type && node is JsonObject root)
                {
                    root.Insert(0, "$schema", "https://json-schema.org/draft/2020-12/schema");
                    root.Insert(1, "title", title);
                    root.Insert(2, "description", description);
                }

                return node;
            },
        };
        var schema = LineTestJson.Definitions.GetJsonSchemaAsNode(type, exporter);
        return schema.ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping }) + "\n";
    }
}
