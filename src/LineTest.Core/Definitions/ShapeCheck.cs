using System.Reflection;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Serialization;
using System.Text.Json.Serialization.Metadata;

namespace LineTest.Core.Definitions;

/// <summary>
/// Checks a scanned document against the model's own serialisation metadata (<see cref="JsonTypeInfo"/>) before it is
/// deserialised: every unknown key, missing required key, value of the wrong type, null where none is allowed, and
/// step without a known <c>kind</c>, across the whole file — a bad step does not hide the steps after it. Each
/// problem is a JSON path and a reason; nothing is read back from the serialiser's messages.
/// </summary>
internal static class ShapeCheck
{
    /// <summary>Adds every shape problem of <paramref name="node"/> read as <paramref name="type"/>.</summary>
    public static void Check(JsonNode node, Type type, JsonSerializerOptions options, ProblemList problems) =>
        Visit(node, type, "$", options, problems);

    private static void Visit(JsonNode node, Type type, string path, JsonSerializerOptions options, ProblemList problems)
    {
        var underlying = Nullable.GetUnderlyingType(type) ?? type;
        var kind = node.GetValueKind();
        if (underlying == typeof(string))
        {
            problems.AddIf(kind != JsonValueKind.String, path, $"expected a string, not {Describe(kind)}");
        }
        else if (underlying == typeof(bool))
        {
            problems.AddIf(kind is not (JsonValueKind.True or JsonValueKind.False), path, $"expected true or false, not {Describe(kind)}");
        }
        else if (underlying == typeof(int) || underlying == typeof(long))
        {
            WholeNumber(node, kind, underlying == typeof(int), path, problems);
        }
        else if (underlying == typeof(double))
        {
            if (kind != JsonValueKind.Number)
            {
                problems.Add(path, $"expected a number, not {Describe(kind)}");
            }
            else if (!node.AsValue().TryGetValue<JsonElement>(out var element) || !element.TryGetDouble(out var value) || !double.IsFinite(value))
            {
                problems.Add(path, "the number is too large to be used");
            }
        }
        else if (underlying.IsEnum)
        {
            EnumWord(node, kind, underlying, path, problems);
        }
        else
        {
            Structured(node, kind, options.GetTypeInfo(underlying), path, options, problems);
        }
    }

    private static void Structured(JsonNode node, JsonValueKind kind, JsonTypeInfo info, string path, JsonSerializerOptions options, ProblemList problems)
    {
        switch (info.Kind)
        {
            case JsonTypeInfoKind.Enumerable:
                if (node is not JsonArray array)
                {
                    problems.Add(path, $"expected an array, not {Describe(kind)}");
                    return;
                }

                var elementType = info.ElementType ?? typeof(object);
                for (var i = 0; i < array.Count; i++)
                {
                    if (array[i] is { } item)
                    {
                        Visit(item, elementType, $"{path}[{i}]", options, problems);
                    }
                    else
                    {
                        problems.Add($"{path}[{i}]", "the list entry is null; give a value");
                    }
                }

                break;
            case JsonTypeInfoKind.Object:
                if (node is not JsonObject obj)
                {
                    problems.Add(path, $"expected an object, not {Describe(kind)}");
                    return;
                }

                Properties(obj, info, path, options, problems);
                break;
        }
    }

    private static void Properties(JsonObject obj, JsonTypeInfo info, string path, JsonSerializerOptions options, ProblemList problems)
    {
        string? discriminator = null;
        if (info.PolymorphismOptions is { } polymorphism)
        {
            discriminator = polymorphism.TypeDiscriminatorPropertyName;
            var kinds = polymorphism.DerivedTypes.Select(d => d.TypeDiscriminator as string).OfType<string>().ToList();
            var known = $"(known: {string.Join(", ", kinds)})";
            if (!obj.TryGetPropertyValue(discriminator, out var kindNode))
            {
                problems.Add(path, $"the object needs a '{discriminator}' key naming its kind {known}");
                return;
            }

            var word = kindNode?.GetValueKind() == JsonValueKind.String ? kindNode.GetValue<string>() : null;
            var derived = polymorphism.DerivedTypes.FirstOrDefault(d => word is not null && d.TypeDiscriminator as string == word);
            if (derived.DerivedType is null)
            {
                problems.Add(path, word is null ? $"'{discriminator}' must be a string naming the kind {known}" : $"unknown kind '{word}' {known}");
                return;
            }

            info = options.GetTypeInfo(derived.DerivedType);
        }

        var byName = info.Properties.Where(p => p.Set is not null || p.IsRequired || p.AssociatedParameter is not null)
            .ToDictionary(p => p.Name, StringComparer.Ordinal);
        foreach (var (key, value) in obj)
        {
            if (key == discriminator)
            {
                continue;
            }

            var childPath = JsonLocator.Combine(path, key);
            if (!byName.TryGetValue(key, out var property))
            {
                problems.Add(childPath, $"unknown property '{key}' (check the spelling; keys are camelCase)");
            }
            else if (value is null)
            {
                problems.AddIf(!property.IsSetNullable, childPath, "a value is required here, not null");
            }
            else
            {
                Visit(value, property.PropertyType, childPath, options, problems);
            }
        }

        var missing = byName.Values.Where(p => p.IsRequired && !obj.ContainsKey(p.Name)).Select(p => $"'{p.Name}'").ToList();
        if (missing.Count > 0)
        {
            problems.Add(path, missing.Count == 1 ? $"missing required property {missing[0]}" : $"missing required properties {string.Join(", ", missing)}");
        }
    }

    private static void WholeNumber(JsonNode node, JsonValueKind kind, bool int32, string path, ProblemList problems)
    {
        if (kind != JsonValueKind.Number)
        {
            problems.Add(path, $"expected a whole number, not {Describe(kind)}");
            return;
        }

        var element = node.AsValue().GetValue<JsonElement>();
        var fits = int32 ? element.TryGetInt32(out _) : element.TryGetInt64(out _);
        if (!fits)
        {
            problems.Add(path, element.TryGetDouble(out var d) && double.IsFinite(d) && Math.Floor(d) == d
                ? $"expected a whole number, and {element.GetRawText()} is too large"
                : $"expected a whole number, not {element.GetRawText()}");
        }
    }

    private static void EnumWord(JsonNode node, JsonValueKind kind, Type enumType, string path, ProblemList problems)
    {
        var words = enumType.GetFields(BindingFlags.Public | BindingFlags.Static)
            .Select(f => f.GetCustomAttribute<JsonStringEnumMemberNameAttribute>()?.Name ?? f.Name)
            .ToList();
        var what = string.Concat(enumType.Name.Select((c, i) => i > 0 && char.IsUpper(c) ? $" {char.ToLowerInvariant(c)}" : char.ToLowerInvariant(c).ToString()));
        if (kind != JsonValueKind.String)
        {
            problems.Add(path, $"expected a {what} word (known: {string.Join(", ", words)}), not {Describe(kind)}");
            return;
        }

        var given = node.GetValue<string>();
        problems.AddIf(!words.Contains(given, StringComparer.Ordinal), path, $"unknown {what} '{given}' (known: {string.Join(", ", words)})");
    }

    private static string Describe(JsonValueKind kind) => kind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => "a string",
        JsonValueKind.Number => "a number",
        JsonValueKind.True or JsonValueKind.False => "true or false",
        JsonValueKind.Null => "null",
        _ => "nothing",
    };
}
