namespace LineTest.Factory.Schema;

/// <summary>One migration file.</summary>
/// <param name="Version">Its number (the file name's first four digits).</param>
/// <param name="Name">The file name.</param>
/// <param name="Sql">Its text.</param>
/// <param name="Sha256">SHA-256 of its UTF-8 text, recorded when applied.</param>
public sealed record FactoryMigration(int Version, string Name, string Sql, string Sha256);
