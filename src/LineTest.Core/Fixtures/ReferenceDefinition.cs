namespace LineTest.Core.Fixtures;

/// <summary>The reference thermometer: its sensor model, certificate, and readout.</summary>
public sealed record ReferenceDefinition
{
    /// <summary>The sensor and its coefficients (from its calibration certificate).</summary>
    public required ReferenceSensorDefinition Sensor { get; init; }

    /// <summary>Expanded uncertainty of the reference from its certificate, °C.</summary>
    public double CertificateExpandedUncertaintyC { get; init; } = 0.02;

    /// <summary>Coverage factor stated on the certificate.</summary>
    public double CertificateCoverageFactor { get; init; } = 2.0;

    /// <summary>Readout resolution in the raw unit (Ω, mV or °C).</summary>
    public double ReadoutResolution { get; init; } = 0.0001;

    /// <summary>Serial connection for a real readout (ignored by the simulator).</summary>
    public PortDefinition? Port { get; init; }
}
