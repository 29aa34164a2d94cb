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
/// problem is a JSON path and a reason; nothing is read back from the serialiser's messages. While it checks, it
/// repairs the document in place (<see cref="ShapeRepair"/>): an unknown key is removed, a bad optional value is
/// removed (its default applies), a bad required value or list entry is replaced by a placeholder, so the parts that
/// parsed can still be checked for sense; the repair records what it touched.
/// </summary>
internal static class ShapeCheck
{
    /// <summary>Adds every shape problem of <paramref name="node"/> read as <paramref name="type"/>.</summary>
    public static void Check(JsonNode node, Type type, JsonSerializerOptions options, ProblemList problems, ShapeRepair repair)
    {
        if (!Visit(node, type, "$", options, problems, repair))
        {
            repair.Broken("$");
        }
    }

    /// <summary>Checks one value; false when it has a problem of its own and must be replaced by its parent.</summary>
    private static bool Visit(JsonNode node, Type type, string path, JsonSerializerOptions options, ProblemList problems, ShapeRepair repair)
    {
        var underlying = Nullable.GetUnderlyingType(type) ?? type;
        var kind = node.GetValueKind();
        var before = problems.Items.Count;
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
            return Structured(node, kind, options.GetTypeInfo(underlying), path, options, problems, repair);
        }

        return problems.Items.Count == before;
    }

    private static bool Structured(JsonNode node, JsonValueKind kind, JsonTypeInfo info, string path, JsonSerializerOptions options, ProblemList problems, ShapeRepair repair)
    {
        switch (info.Kind)
        {
            case JsonTypeInfoKind.Enumerable:
                if (node is not JsonArray array)
                {
                    problems.Add(path, $"expected an array, not {Describe(kind)}");
                    return false;
                }

                var elementType = info.ElementType ?? typeof(object);
                for (var i = 0; i < array.Count; i++)
                {
                    var itemPath = $"{path}[{i}]";
                    if (array[i] is { } item)
                    {
                        if (!Visit(item, elementType, itemPath, options, problems, repair))
                        {
                            array[i] = repair.Replace(itemPath, elementType, options);
                        }
                    }
                    else
                    {
                        problems.Add(itemPath, "the list entry is null; give a value");
                        array[i] = repair.Replace(itemPath, elementType, options);
                    }
                }

                return true;
            case JsonTypeInfoKind.Object:
                if (node is not JsonObject obj)
                {
                    problems.Add(path, $"expected an object, not {Describe(kind)}");
                    return false;
                }

                return Properties(obj, info, path, options, problems, repair);
            default:
                return true;
        }
    }

    private static bool Properties(JsonObject obj, JsonTypeInfo info, string path, JsonSerializerOptions options, ProblemList problems, ShapeRepair repair)
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
                return false;
            }

            var word = kindNode?.GetValueKind() == JsonValueKind.String ? kindNode.GetValue<string>() : null;
            var derived = polymorphism.DerivedTypes.FirstOrDefault(d => word is not null && d.TypeDiscriminator as string == word);
            if (derived.DerivedType is null)
            {
                problems.Add(path, word is null ? $"'{discriminator}' must be a string naming the kind {known}" : $"unknown kind '{word}' {known}");
                return false;
            }

            info = options.GetTypeInfo(derived.DerivedType);
        }

        var byName = info.Properties.Where(p => p.Set is not null || p.IsRequired || p.AssociatedParameter is not null)
            .ToDictionary(p => p.Name, StringComparer.Ordinal);
        // Repairs wait until the walk over the object's keys is over (an object cannot change while it is enumerated).
        var unknown = new List<(string Key, string Path)>();
        var bad = new List<(string Key, string Path, JsonPropertyInfo Property)>();
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
                unknown.Add((key, childPath));
            }
            else if (value is null)
            {
                if (!property.IsSetNullable)
                {
                    problems.Add(childPath, "a value is required here, not null");
                    bad.Add((key, childPath, property));
                }
            }
            else if (!Visit(value, property.PropertyType, childPath, options, problems, repair))
            {
                bad.Add((key, childPath, property));
            }
        }

        foreach (var (key, childPath) in unknown)
        {
            obj.Remove(key);
            repair.Broken(childPath);
        }

        foreach (var (key, childPath, property) in bad)
        {
            if (property.IsRequired)
            {
                obj[key] = repair.Replace(childPath, property.PropertyType, options);
            }
            else
            {
                obj.Remove(key);
                repair.Broken(childPath);
            }
        }

        var missing = byName.Values.Where(p => p.IsRequired && !obj.ContainsKey(p.Name)).ToList();
        if (missing.Count > 0)
        {
            var names = missing.Select(p => $"'{p.Name}'").ToList();
            problems.Add(path, names.Count == 1 ? $"missing required property {names[0]}" : $"missing required properties {string.Join(", ", names)}");
            foreach (var property in missing)
            {
                obj[property.Name] = repair.Replace(JsonLocator.Combine(path, property.Name), property.PropertyType, options);
            }
        }

        return true;
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
