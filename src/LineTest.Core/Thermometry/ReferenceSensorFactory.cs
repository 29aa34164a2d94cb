using LineTest.Core.Fixtures;

namespace LineTest.Core.Thermometry;

/// <summary>
/// Builds the fixture's reference sensor from its <see cref="ReferenceSensorDefinition"/>. Field names in the
/// messages are those of the fixture file: kind, r0, a, b, c, r25, beta, type, coldJunctionC.
/// </summary>
public static class ReferenceSensorFactory
{
    /// <summary>The kinds a definition may name.</summary>
    public static IReadOnlyList<string> Kinds { get; } = ["prt", "thermistor", "thermocouple", "celsius"];

    /// <summary>Builds the sensor, or returns every problem of the definition.</summary>
    public static ReferenceSensorResult Create(ReferenceSensorDefinition definition)
    {
        ArgumentNullException.ThrowIfNull(definition);
        var kind = definition.Kind?.Trim().ToLowerInvariant();
        return kind switch
        {
            "prt" => CreatePrt(definition),
            "thermistor" => CreateThermistor(definition),
            "thermocouple" => CreateThermocouple(definition),
            "celsius" => CreateCelsius(definition),
            _ => ReferenceSensorResult.Failure(
                [$"kind: '{definition.Kind}' is not a reference sensor kind; use {string.Join(", ", Kinds)}"]),
        };
    }

    private static ReferenceSensorResult CreatePrt(ReferenceSensorDefinition definition)
    {
        var errors = new List<string>();
        RejectFields(errors, "prt", definition, r25: true, beta: true, type: true, coldJunction: true);
        if (definition.R0 is not { } r0)
        {
            errors.Add("r0: required for kind 'prt' (resistance at 0 °C in Ω: 100 for Pt100, 1000 for Pt1000)");
            return ReferenceSensorResult.Failure(errors);
        }

        // IEC 60751:2008 coefficients stand in for any the certificate does not state.
        var a = definition.A ?? PlatinumResistanceThermometer.IecA;
        var b = definition.B ?? PlatinumResistanceThermometer.IecB;
        var c = definition.C ?? PlatinumResistanceThermometer.IecC;
        errors.AddRange(PlatinumResistanceThermometer.Validate(r0, a, b, c));
        return errors.Count > 0
            ? ReferenceSensorResult.Failure(errors)
            : ReferenceSensorResult.Success(new PlatinumResistanceThermometer(r0, a, b, c));
    }

    private static ReferenceSensorResult CreateThermistor(ReferenceSensorDefinition definition)
    {
        var errors = new List<string>();
        RejectFields(errors, "thermistor", definition, r0: true, type: true, coldJunction: true);
        var hasSteinhartHart = definition.A is not null || definition.B is not null || definition.C is not null;
        var hasBeta = definition.R25 is not null || definition.Beta is not null;
        if (hasSteinhartHart && hasBeta)
        {
            errors.Add("a, b, c / r25, beta: give either the Steinhart-Hart coefficients a, b, c or the beta model r25 and beta, not both");
            return ReferenceSensorResult.Failure(errors);
        }

        if (hasSteinhartHart)
        {
            AddMissing(errors, "thermistor (Steinhart-Hart)", ("a", definition.A), ("b", definition.B), ("c", definition.C));
            if (errors.Count > 0)
            {
                return ReferenceSensorResult.Failure(errors);
            }

            errors.AddRange(SteinhartHartThermistor.Validate(definition.A!.Value, definition.B!.Value, definition.C!.Value));
            return errors.Count > 0
                ? ReferenceSensorResult.Failure(errors)
                : ReferenceSensorResult.Success(new SteinhartHartThermistor(definition.A.Value, definition.B.Value, definition.C.Value));
        }

        if (hasBeta)
        {
            AddMissing(errors, "thermistor (beta model)", ("r25", definition.R25), ("beta", definition.Beta));
            if (errors.Count > 0)
            {
                return ReferenceSensorResult.Failure(errors);
            }

            errors.AddRange(BetaThermistor.Validate(definition.R25!.Value, definition.Beta!.Value));
            return errors.Count > 0
                ? ReferenceSensorResult.Failure(errors)
                : ReferenceSensorResult.Success(new BetaThermistor(definition.R25.Value, definition.Beta.Value));
        }

        errors.Add("a, b, c / r25, beta: kind 'thermistor' needs the Steinhart-Hart coefficients a, b, c or the beta model r25 and beta");
        return ReferenceSensorResult.Failure(errors);
    }

    private static ReferenceSensorResult CreateThermocouple(ReferenceSensorDefinition definition)
    {
        var errors = new List<string>();
        RejectFields(errors, "thermocouple", definition, r0: true, a: true, b: true, c: true, r25: true, beta: true);
        ThermocoupleType? type = definition.Type?.Trim().ToUpperInvariant() switch
        {
            null or "" => null,
            "K" => ThermocoupleType.K,
            "T" => ThermocoupleType.T,
            _ => null,
        };
        if (type is null)
        {
            errors.Add(string.IsNullOrWhiteSpace(definition.Type)
                ? "type: required for kind 'thermocouple'; use K or T"
                : $"type: '{definition.Type}' is not a supported thermocouple type; use K or T");
            return ReferenceSensorResult.Failure(errors);
        }

        // A fixture without a stated cold junction uses an ice point or a readout that compensates itself.
        var coldJunctionC = definition.ColdJunctionC ?? 0.0;
        errors.AddRange(Thermocouple.Validate(type.Value, coldJunctionC));
        return errors.Count > 0
            ? ReferenceSensorResult.Failure(errors)
            : ReferenceSensorResult.Success(new Thermocouple(type.Value, coldJunctionC));
    }

    private static ReferenceSensorResult CreateCelsius(ReferenceSensorDefinition definition)
    {
        var errors = new List<string>();
        RejectFields(errors, "celsius", definition, r0: true, a: true, b: true, c: true, r25: true, beta: true, type: true, coldJunction: true);
        return errors.Count > 0
            ? ReferenceSensorResult.Failure(errors)
            : ReferenceSensorResult.Success(CelsiusReadout.Instance);
    }

    private static void AddMissing(List<string> errors, string model, params (string Field, double? Value)[] fields)
    {
        foreach (var (field, value) in fields)
        {
            if (value is null)
            {
                errors.Add($"{field}: required for a {model}");
            }
        }
    }

    // A coefficient given for a sensor kind that does not use it is almost always a copy-and-paste slip
    // (e.g. PRT coefficients left in after switching to a thermocouple), so it is reported, not ignored.
    private static void RejectFields(
        List<string> errors,
        string kind,
        ReferenceSensorDefinition definition,
        bool r0 = false,
        bool a = false,
        bool b = false,
        bool c = false,
        bool r25 = false,
        bool beta = false,
        bool type = false,
        bool coldJunction = false)
    {
        void Check(bool reject, string field, bool present)
        {
            if (reject && present)
            {
                errors.Add($"{field}: does not apply to kind '{kind}'; remove it");
            }
        }

        Check(r0, "r0", definition.R0 is not null);
        Check(a, "a", definition.A is not null);
        Check(b, "b", definition.B is not null);
        Check(c, "c", definition.C is not null);
        Check(r25, "r25", definition.R25 is not null);
        Check(beta, "beta", definition.Beta is not null);
        Check(type, "type", definition.Type is not null);
        Check(coldJunction, "coldJunctionC", definition.ColdJunctionC is not null);
    }
}
