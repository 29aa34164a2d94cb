namespace LineTest.Core.Results;

/// <summary>Text forms of <see cref="Verdict"/> used in files, the database and on screen.</summary>
public static class VerdictExtensions
{
    /// <summary>The lower-case word stored in the database and JSON: pass, fail or error.</summary>
    public static string ToWord(this Verdict verdict) => verdict switch
    {
        Verdict.Pass => "pass",
        Verdict.Fail => "fail",
        Verdict.Error => "error",
        _ => throw new ArgumentOutOfRangeException(nameof(verdict), verdict, "Unknown verdict."),
    };

    /// <summary>Parses the stored word; returns null for anything else.</summary>
    public static Verdict? ParseWord(string? word) => word?.Trim().ToLowerInvariant() switch
    {
        "pass" => Verdict.Pass,
        "fail" => Verdict.Fail,
        "error" => Verdict.Error,
        _ => null,
    };

    /// <summary>Combines two verdicts: error beats fail beats pass.</summary>
    public static Verdict Worst(this Verdict a, Verdict b) => (Verdict)Math.Max((int)a, (int)b);
}
