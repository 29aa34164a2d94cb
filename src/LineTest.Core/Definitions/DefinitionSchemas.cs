using System.Reflection;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Schema;
using LineTest.Core.Fixtures;
using LineTest.Core.Sequences;

namespace LineTest.Core.Definitions;

/// <summary>
/// JSON Schemas (draft 2020-12) of sequence and fixture files, exported from the very model the loader uses, so
/// an editor completes and checks exactly what the station accepts: every number carries its bound from
/// <see cref="DefinitionBounds"/> (<c>minimum</c>, <c>exclusiveMinimum</c>, <c>maximum</c>), every name its grammar
/// (<c>pattern</c>, <c>maxLength</c>), every word key its words (<c>enum</c>, from <see cref="DefinitionWords"/>), and
/// every key a description. Committed as <c>sequences/sequence.schema.json</c> and <c>fixtures/fixture.schema.json</c>;
/// a test keeps them in step.
/// </summary>
public static class DefinitionSchemas
{
    /// <summary>The schema of a sequence file, as indented JSON text.</summary>
    /// <param name="describe">The description of a model property (its documentation summary), or null when there is none.</param>
    public static string Sequence(Func<MemberInfo, string?>? describe = null) => Export(typeof(SequenceDefinition), "LineTest sequence",
        "One product revision's end-of-line test: setpoints, stability and soak, trim method and steps.", describe);

    /// <summary>The schema of a fixture file, as indented JSON text.</summary>
    /// <param name="describe">The description of a model property (its documentation summary), or null when there is none.</param>
    public static string Fixture(Func<MemberInfo, string?>? describe = null) => Export(typeof(FixtureDefinition), "LineTest fixture",
        "A station's fixture: temperature source and safe range, reference thermometer, meter, slot wiring.", describe);

    private static string Export(Type type, string title, string description, Func<MemberInfo, string?>? describe)
    {
        var exporter = new JsonSchemaExporterOptions
        {
            TreatNullObliviousAsNonNullable = true,
            TransformSchemaNode = (context, node) =>
            {
                if (node is not JsonObject schema)
                {
                    return node;
                }

                if (context.PropertyInfo is { AttributeProvider: MemberInfo member } property)
                {
                    Annotate(schema, property.DeclaringType, member, describe);
                }
                else if (schema["properties"] is JsonObject { } properties && properties["kind"] is JsonObject { } kind && kind["const"] is not null)
                {
                    kind["description"] = "The step kind.";
                }

                if (context.PropertyInfo is null && context.TypeInfo.Type == type)
                {
                    schema.Insert(0, "$schema", "https://json-schema.org/draft/2020-12/schema");
                    schema.Insert(1, "title", title);
                    schema.Insert(2, "description", description);
                }

                return node;
            },
        };
        var schemaNode = LineTestJson.Definitions.GetJsonSchemaAsNode(type, exporter);
        return schemaNode.ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping }) + "\n";
    }

    private static void Annotate(JsonObject schema, Type declaringType, MemberInfo member, Func<MemberInfo, string?>? describe)
    {
        var text = describe?.Invoke(member) ?? member.Name;
        switch (DefinitionBounds.ForProperty(declaringType, member.Name))
        {
            case NumberBound number:
                // A list of numbers bounds its items.
                var target = schema["items"] as JsonObject ?? schema;
                if (number.ExclusiveMinimum)
                {
                    target["exclusiveMinimum"] = number.Minimum;
                }
                else
                {
                    target["minimum"] = number.Minimum;
                }

                target["maximum"] = number.Maximum;
                text = $"{text} Allowed: {number.Describe()}.";
                break;
            case ListBound list:
                schema["minItems"] = list.MinItems;
                if (list.Unique)
                {
                    schema["uniqueItems"] = true;
                }

                text = $"{text} Allowed: {list.Describe()}.";
                break;
            case TextBound name:
                schema["pattern"] = name.Pattern;
                schema["maxLength"] = name.MaxLength;
                text = $"{text} Must be {name.Rule}, at most {name.MaxLength} characters.";
                break;
        }

        if (DefinitionWords.ForProperty(declaringType, member.Name) is { } words)
        {
            schema["enum"] = new JsonArray([.. words.Select(w => (JsonNode?)JsonValue.Create(w))]);
        }

        schema.Remove("description");
        schema.Insert(0, "description", text);
    }
}
