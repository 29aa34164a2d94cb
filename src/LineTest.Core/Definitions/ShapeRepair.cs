using System.Reflection;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Serialization;
using System.Text.Json.Serialization.Metadata;

namespace LineTest.Core.Definitions;

/// <summary>
/// What <see cref="ShapeCheck"/> changed to make a document with structural problems readable, so the parts that
/// parsed can still be checked for sense: the paths whose value was replaced by a placeholder or removed, unknown keys
/// included (<see cref="BrokenPaths"/>; a misspelt key was meant to set something, and its default now stands in). A
/// semantic problem that depends on one of them is not reported (<see cref="DependentProblems"/>): the placeholder is
/// not what the engineer wrote.
/// </summary>
internal sealed class ShapeRepair
{
    /// <summary>Deepest placeholder nesting; the model is a few levels deep, so this only guards a cycle.</summary>
    private const int MaxDepth = 16;

    private readonly List<string> _broken = [];

    /// <summary>Paths whose value is a placeholder or was removed.</summary>
    public IReadOnlyList<string> BrokenPaths => _broken;

    /// <summary>Records that the value at <paramref name="path"/> is gone (removed, its default applies).</summary>
    public void Broken(string path) => _broken.Add(path);

    /// <summary>A placeholder of <paramref name="type"/> for the bad value at <paramref name="path"/>, recorded as broken.</summary>
    public JsonNode Replace(string path, Type type, JsonSerializerOptions options)
    {
        _broken.Add(path);
        return Placeholder(type, options, 0);
    }

    /// <summary>
    /// The smallest value of <paramref name="type"/> the serialiser reads: empty text, zero, false, the first word of an
    /// enum, an empty list, or an object with placeholders for its required keys (the first kind of a polymorphic one).
    /// </summary>
    private static JsonNode Placeholder(Type type, JsonSerializerOptions options, int depth)
    {
        var underlying = Nullable.GetUnderlyingType(type) ?? type;
        if (underlying == typeof(string))
        {
            return JsonValue.Create(string.Empty);
        }

        if (underlying == typeof(bool))
        {
            return JsonValue.Create(false);
        }

        if (underlying == typeof(int) || underlying == typeof(long) || underlying == typeof(double))
        {
            return JsonValue.Create(0);
        }

        if (underlying.IsEnum)
        {
            var first = underlying.GetFields(BindingFlags.Public | BindingFlags.Static).First();
            return JsonValue.Create(first.GetCustomAttribute<JsonStringEnumMemberNameAttribute>()?.Name ?? first.Name);
        }

        var info = options.GetTypeInfo(underlying);
        switch (info.Kind)
        {
            case JsonTypeInfoKind.Enumerable:
                return new JsonArray();
            case JsonTypeInfoKind.Object when depth < MaxDepth:
                var obj = new JsonObject();
                if (info.PolymorphismOptions is { DerivedTypes.Count: > 0 } polymorphism)
                {
                    var derived = polymorphism.DerivedTypes[0];
                    obj[polymorphism.TypeDiscriminatorPropertyName] = JsonValue.Create(derived.TypeDiscriminator as string);
                    info = options.GetTypeInfo(derived.DerivedType);
                }

                foreach (var property in info.Properties.Where(p => p.IsRequired))
                {
                    obj[property.Name] = Placeholder(property.PropertyType, options, depth + 1);
                }

                return obj;
            default:
                return new JsonObject();
        }
    }
}
