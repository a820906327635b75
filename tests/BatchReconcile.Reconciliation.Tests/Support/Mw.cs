namespace BatchReconcile.Reconciliation.Tests.Support;

/// <summary>
/// Molar masses (g/mol = kg/kmol) summed by hand from the CIAAW 2021 standard atomic weights, abridged as in the
/// IUPAC Periodic Table of the Elements (2022): H 1.008, C 12.011, N 14.007, O 15.999, S 32.06, Cl 35.45, Pd 106.42.
/// </summary>
internal static class Mw
{
    public const double H2 = 2.016;                // 2 × 1.008
    public const double Water = 18.015;            // 2.016 + 15.999
    public const double CarbonDioxide = 44.009;    // 12.011 + 2 × 15.999
    public const double HydrogenChloride = 36.458; // 1.008 + 35.45
    public const double Palladium = 106.42;

    public const double EthylNitrobenzoate = 195.174; // C9H9NO4: 108.099 + 9.072 + 14.007 + 63.996
    public const double Benzocaine = 165.192;         // C9H11NO2: 108.099 + 11.088 + 14.007 + 31.998
    public const double NitrobenzoicAcid = 167.120;   // C7H5NO4: 84.077 + 5.040 + 14.007 + 63.996
    public const double Ethanol = 46.069;             // C2H6O: 24.022 + 6.048 + 15.999

    public const double BocPiperazine = 186.255;          // C9H18N2O2: 108.099 + 18.144 + 28.014 + 31.998
    public const double PiperazineDihydrochloride = 159.054; // C4H12Cl2N2: 48.044 + 12.096 + 70.900 + 28.014
    public const double Isobutylene = 56.108;             // C4H8: 48.044 + 8.064

    public const double IndoleCarboxylicAcid = 161.160; // C9H7NO2: 108.099 + 7.056 + 14.007 + 31.998
    public const double Indole = 117.151;               // C8H7N: 96.088 + 7.056 + 14.007

    public const double BenzylAlcohol = 108.140;  // C7H8O: 84.077 + 8.064 + 15.999
    public const double TosylChloride = 190.641;  // C7H7ClO2S: 84.077 + 7.056 + 35.45 + 31.998 + 32.06
    public const double BenzylTosylate = 262.323; // C14H14O3S: 168.154 + 14.112 + 47.997 + 32.06
    public const double Triethylamine = 101.193;  // C6H15N: 72.066 + 15.120 + 14.007

    public const double BenzylCyanide = 117.151;      // C8H7N: 96.088 + 7.056 + 14.007
    public const double Phenylacetamide = 135.166;    // C8H9NO: 96.088 + 9.072 + 14.007 + 15.999
    public const double Benzylamine = 107.156;        // C7H9N: 84.077 + 9.072 + 14.007
    public const double BenzylamineHcl = 143.614;     // C7H10ClN: 84.077 + 10.080 + 35.45 + 14.007
    public const double SodiumHypochlorite = 74.439;  // NaClO: 22.990 + 35.45 + 15.999 (Na 22.990)
    public const double SodiumHydroxide = 39.997;     // NaOH: 22.990 + 15.999 + 1.008
}
