namespace LineTest.Rig.Instruments;

/// <summary>A multi-channel DC voltmeter (a DMM with a channel scanner).</summary>
public interface IVoltmeter
{
    /// <summary>Routes to <paramref name="channel"/> and reads DC volts.</summary>
    Task<double> ReadDcVoltsAsync(int channel, CancellationToken cancellationToken);
}
