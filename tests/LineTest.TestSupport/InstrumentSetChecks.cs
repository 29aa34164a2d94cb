using System.Collections;
using System.Reflection;
using LineTest.Rig.Instruments;

namespace LineTest.TestSupport;

/// <summary>
/// Checks over every instrument property of <see cref="RigInstruments"/>, found by reflection, so an instrument added
/// later is checked without anyone remembering to add it here. Each returns what is wrong (empty when all is well).
/// </summary>
public static class InstrumentSetChecks
{
    /// <summary>Every instrument property of the set (source, reference, meter, unit links, source-measure unit, …).</summary>
    public static IReadOnlyList<PropertyInfo> InstrumentProperties { get; } =
        typeof(RigInstruments).GetProperties(BindingFlags.Public | BindingFlags.Instance)
            .Where(p => p.PropertyType.IsInterface && p.PropertyType.Namespace == typeof(RigInstruments).Namespace
                || IsInstrumentDictionary(p.PropertyType))
            .ToList();

    /// <summary>Every instrument of <paramref name="set"/> is there (no optional instrument left out), and every slot has a link.</summary>
    public static IReadOnlyList<string> Missing(RigInstruments set)
    {
        ArgumentNullException.ThrowIfNull(set);
        var problems = new List<string>();
        foreach (var property in InstrumentProperties)
        {
            var value = property.GetValue(set);
            if (value is null)
            {
                problems.Add($"the instrument set has no {property.Name}: a wrapper test over it would not see that instrument");
            }
            else if (value is ICollection { Count: 0 })
            {
                problems.Add($"the instrument set's {property.Name} is empty");
            }
        }

        return problems;
    }

    /// <summary>
    /// What <paramref name="wrapped"/> lacks of <paramref name="inner"/>: every instrument must come through (every keyed
    /// instrument under the same keys).
    /// </summary>
    public static IReadOnlyList<string> Dropped(RigInstruments inner, RigInstruments wrapped)
    {
        ArgumentNullException.ThrowIfNull(inner);
        ArgumentNullException.ThrowIfNull(wrapped);
        var problems = new List<string>();
        foreach (var property in InstrumentProperties)
        {
            var given = property.GetValue(inner);
            var passed = property.GetValue(wrapped);
            if (given is null)
            {
                continue;
            }

            if (passed is null)
            {
                problems.Add($"the wrapper drops the {property.Name} ({property.PropertyType.Name}) it was given");
            }
            else if (given is IEnumerable givenItems && passed is IEnumerable passedItems)
            {
                var givenKeys = Keys(givenItems);
                var passedKeys = Keys(passedItems);
                if (!givenKeys.SetEquals(passedKeys))
                {
                    problems.Add($"the wrapper passes {property.Name} for {string.Join(", ", passedKeys)}, given {string.Join(", ", givenKeys)}");
                }
            }
        }

        return problems;
    }

    private static bool IsInstrumentDictionary(Type type) =>
        type.IsGenericType && type.GetGenericTypeDefinition() == typeof(IReadOnlyDictionary<,>)
        && type.GetGenericArguments()[1].Namespace == typeof(RigInstruments).Namespace;

    private static HashSet<object> Keys(IEnumerable items)
    {
        var keys = new HashSet<object>();
        foreach (var item in items)
        {
            keys.Add(item!.GetType().GetProperty("Key")!.GetValue(item)!);
        }

        return keys;
    }
}
