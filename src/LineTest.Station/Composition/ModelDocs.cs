using System.Reflection;
using System.Text;
using System.Xml.Linq;

namespace LineTest.Station.Composition;

/// <summary>
/// The documentation summaries of the definition model's properties, read from the XML documentation file the build
/// writes beside <c>LineTest.Core.dll</c>: the JSON Schema describes each key with the same words as the code, so the
/// two cannot drift apart. Without the file (it is not shipped everywhere) there are no summaries.
/// </summary>
public sealed class ModelDocs
{
    private readonly Dictionary<string, string> _summaries;

    private ModelDocs(Dictionary<string, string> summaries) => _summaries = summaries;

    /// <summary>The summaries of the assembly that holds the definition model.</summary>
    public static ModelDocs ForCoreModel()
    {
        var assembly = typeof(Core.Definitions.DefinitionSchemas).Assembly;
        var path = Path.ChangeExtension(assembly.Location, ".xml");
        try
        {
            return new ModelDocs(Read(XDocument.Load(path)));
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or System.Xml.XmlException or ArgumentException)
        {
            return new ModelDocs([]);
        }
    }

    /// <summary>The summary of <paramref name="member"/>, in one line, or null.</summary>
    public string? Describe(MemberInfo member)
    {
        ArgumentNullException.ThrowIfNull(member);
        var prefix = member.MemberType == MemberTypes.Property ? "P" : "F";
        return _summaries.TryGetValue($"{prefix}:{member.DeclaringType?.FullName?.Replace('+', '.')}.{member.Name}", out var text) ? text : null;
    }

    private static Dictionary<string, string> Read(XDocument document)
    {
        var summaries = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var member in document.Descendants("member"))
        {
            if (member.Attribute("name")?.Value is { } name && member.Element("summary") is { } summary)
            {
                summaries[name] = Flatten(summary);
            }
        }

        return summaries;
    }

    /// <summary>The summary's text with references written as their names and white space collapsed.</summary>
    private static string Flatten(XElement summary)
    {
        var text = new StringBuilder();
        foreach (var node in summary.DescendantNodes())
        {
            switch (node)
            {
                case XText t when t.Parent?.Name.LocalName is not ("see" or "paramref" or "typeparamref"):
                    text.Append(t.Value);
                    break;
                case XElement { Name.LocalName: "see" or "seealso" } see:
                    var target = see.Attribute("cref")?.Value ?? see.Attribute("langword")?.Value ?? see.Value;
                    text.Append(see.Value.Length > 0 ? see.Value : target[(target.LastIndexOfAny([':', '.']) + 1)..]);
                    break;
                case XElement { Name.LocalName: "paramref" or "typeparamref" } reference:
                    text.Append(reference.Attribute("name")?.Value);
                    break;
            }
        }

        return string.Join(' ', text.ToString().Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries));
    }
}
